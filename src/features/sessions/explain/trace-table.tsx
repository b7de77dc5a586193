// One code through the declared model and the hypothesis, stage by stage, the first stage where
// they part marked.
import { useEffect, useRef } from 'react';
import type { CordicTrace } from '../../../../shared/numeric';
import { alignTraces, type TraceRow } from './trace-rows';

const cell = (r: TraceRow | undefined) => (r ? r.values.map(([n, v]) => `${n} ${v}`).join('  ') : '—');

export function TraceTable({ declared, hypothesis, hypothesisLabel }: { declared: CordicTrace; hypothesis: CordicTrace; hypothesisLabel: string }) {
  const { rows, parting } = alignTraces(declared, hypothesis);
  const box = useRef<HTMLDivElement>(null);
  const marked = useRef<HTMLTableRowElement>(null);
  // Bring the first difference into view inside the table's own scroll box (not the page's).
  useEffect(() => {
    if (box.current && marked.current) box.current.scrollTop = Math.max(0, marked.current.offsetTop - box.current.clientHeight / 2);
  }, [parting, declared.code]);
  return (
    <div className="grid gap-1">
      <p className="text-sm" data-testid="trace-parting">
        {parting === null ? 'The declared model and the hypothesis agree at every stage for this code.' : `They part at: ${rows[parting].stage}.`}
      </p>
      {/* Scrolls on its own: focusable and named, so a keyboard can reach and scroll it. */}
      <div ref={box} tabIndex={0} role="region" aria-label={`Code ${declared.code}, stage by stage (scrolls)`} className="relative max-h-96 overflow-auto rounded border border-rule">
        <table className="w-full border-collapse font-mono text-xs">
          <caption className="sr-only">Code {declared.code} through the declared model and through {hypothesisLabel}</caption>
          <thead className="sticky top-0 bg-paper text-left">
            <tr>
              <th scope="col" className="px-2 py-1 font-sans">stage</th>
              <th scope="col" className="px-2 py-1 font-sans">declared model</th>
              <th scope="col" className="px-2 py-1 font-sans">hypothesis</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r, i) => {
              const mark = parting !== null && i === parting;
              const after = parting !== null && i > parting;
              return (
                <tr key={r.key} ref={mark ? marked : undefined} data-parting={mark || undefined} className={mark ? 'bg-fail-soft font-bold' : after ? 'text-fail' : ''}>
                  <th scope="row" className="whitespace-nowrap px-2 py-0.5 text-left font-sans font-normal">
                    {r.stage}
                    {mark && <span className="ml-1 font-bold">◀ first difference</span>}
                  </th>
                  <td className="whitespace-nowrap px-2 py-0.5">{cell(r.a)}</td>
                  <td className="whitespace-nowrap px-2 py-0.5">{cell(r.b)}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
    </div>
  );
}
