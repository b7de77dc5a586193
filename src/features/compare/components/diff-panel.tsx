import { useMemo } from 'react';
import type uPlot from 'uplot';
import { panel, panelTitle } from '../../../components/ui';
import type { ComparedPair, ComparedSession } from '../api/compare-types';
import { alignSeries, diffSeries, sessionName } from './chart-data';
import { ANGLE_SYNC, axis, colourOf } from './chart-look';
import { SessionLegend } from './session-legend';
import { UplotChart } from './uplot-chart';

const n = (v: number) => v.toLocaleString('en-US');

/** A vectoring pair: counts of (x, y) vectors, the largest angle and magnitude differences, the first differing vectors. */
function VectorPairSummary({ pair, a, b }: { pair: ComparedPair; a: ComparedSession; b: ComparedSession }) {
  const title = `${sessionName(b)} against ${sessionName(a)}`;
  const v = pair.vector;
  return (
    <div className="grid gap-2" data-testid={`diff-${pair.b}`}>
      <h3 className="font-bold">{title}</h3>
      {!pair.sameCore ? (
        <p className="text-sm" data-testid={`diff-summary-${pair.b}`}>
          Not compared bit for bit: this session is of {b.core.name ?? 'another core'}, whose codes mean other angles and magnitudes than those of {a.core.name ?? 'the reference’s core'}.
        </p>
      ) : pair.common === 0 ? (
        <p className="text-sm" data-testid={`diff-summary-${pair.b}`}>
          No vector in common: these sessions asked different (x, y) pairs, so nothing can be compared bit for bit.
        </p>
      ) : (
        <p className="text-sm" data-testid={`diff-summary-${pair.b}`}>
          <strong className={pair.differing ? 'text-fail' : 'text-pass'} data-testid={`diff-count-${pair.b}`}>
            {n(pair.differing)}
          </strong>{' '}
          of {n(pair.common)} vectors both answered differ
          {pair.differing > 0 && v ? (
            <>
              ; the largest differences are <strong>{n(v.maxAbsAngleDiffLsb)} LSB</strong> of angle and <strong>{n(v.maxAbsMagnitudeDiffLsb)} LSB</strong> of magnitude.
            </>
          ) : (
            ': bit for bit the same.'
          )}
        </p>
      )}
      {v && v.firstDiffering.length > 0 && (
        <div tabIndex={0} role="region" aria-label={`First differing vectors, ${title} (scrolls)`} className="max-h-64 overflow-auto rounded border border-rule">
          <table className="w-full text-xs" aria-label={`First differing vectors, ${title}`}>
            <caption className="sr-only">The first {v.firstDiffering.length} differing vectors in (x, y) order</caption>
            <thead className="sticky top-0 bg-panel text-left text-ink-soft">
              <tr>
                {['x', 'y', 'Direction, °', `angle ${sessionName(a)}`, `angle ${sessionName(b)}`, `magnitude ${sessionName(a)}`, `magnitude ${sessionName(b)}`].map((h) => (
                  <th key={h} scope="col" className="px-2 py-1 text-right font-bold">
                    {h}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody className="font-mono">
              {v.firstDiffering.map((d) => (
                <tr key={`${d.x},${d.y}`} className="border-t border-rule/60 text-right">
                  <td className="px-2 py-0.5">{d.x}</td>
                  <td className="px-2 py-0.5">{d.y}</td>
                  <td className="px-2 py-0.5">{d.degrees.toFixed(3)}</td>
                  <td className="px-2 py-0.5">{d.a.angle}</td>
                  <td className={`px-2 py-0.5 ${d.a.angle !== d.b.angle ? 'font-bold text-fail' : ''}`}>{d.b.angle}</td>
                  <td className="px-2 py-0.5">{d.a.magnitude}</td>
                  <td className={`px-2 py-0.5 ${d.a.magnitude !== d.b.magnitude ? 'font-bold text-fail' : ''}`}>{d.b.magnitude}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {pair.differing > v.firstDiffering.length && (
            <p className="px-2 py-1 text-xs text-ink-soft">
              The first {v.firstDiffering.length} of {n(pair.differing)} are listed; the plot shows in which directions all of them lie.
            </p>
          )}
        </div>
      )}
    </div>
  );
}

function PairSummary({ pair, a, b }: { pair: ComparedPair; a: ComparedSession; b: ComparedSession }) {
  const title = `${sessionName(b)} against ${sessionName(a)}`;
  return (
    <div className="grid gap-2" data-testid={`diff-${pair.b}`}>
      <h3 className="font-bold">{title}</h3>
      {!pair.sameCore ? (
        <p className="text-sm" data-testid={`diff-summary-${pair.b}`}>
          Not compared bit for bit: this session is of {b.core.name ?? 'another core'}, whose codes stand for other angles and values than those of{' '}
          {a.core.name ?? 'the reference’s core'}.
        </p>
      ) : pair.common === 0 ? (
        <p className="text-sm" data-testid={`diff-summary-${pair.b}`}>
          No code in common: these sessions answered different angle codes, so nothing can be compared bit for bit.
        </p>
      ) : (
        <p className="text-sm" data-testid={`diff-summary-${pair.b}`}>
          <strong className={pair.differing ? 'text-fail' : 'text-pass'} data-testid={`diff-count-${pair.b}`}>
            {n(pair.differing)}
          </strong>{' '}
          of {n(pair.common)} codes both answered differ
          {pair.differing > 0 ? (
            <>
              ; the largest difference is <strong>{n(pair.maxAbsDiffLsb)} LSB</strong>.
            </>
          ) : (
            ': bit for bit the same.'
          )}
        </p>
      )}
      {pair.firstDiffering.length > 0 && (
        // Scrolls on its own: focusable and named, so a keyboard can reach and scroll it.
        <div tabIndex={0} role="region" aria-label={`First differing codes, ${title} (scrolls)`} className="max-h-64 overflow-auto rounded border border-rule">
          <table className="w-full text-xs" aria-label={`First differing codes, ${title}`}>
            <caption className="sr-only">The first {pair.firstDiffering.length} differing codes in code order</caption>
            <thead className="sticky top-0 bg-panel text-left text-ink-soft">
              <tr>
                {['Code', 'Angle, °', `cos ${sessionName(a)}`, `cos ${sessionName(b)}`, `sin ${sessionName(a)}`, `sin ${sessionName(b)}`].map((h) => (
                  <th key={h} scope="col" className="px-2 py-1 text-right font-bold">
                    {h}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody className="font-mono">
              {pair.firstDiffering.map((d) => (
                <tr key={d.code} className="border-t border-rule/60 text-right">
                  <td className="px-2 py-0.5">{d.code}</td>
                  <td className="px-2 py-0.5">{d.degrees.toFixed(4)}</td>
                  <td className="px-2 py-0.5">{d.a.cos}</td>
                  <td className={`px-2 py-0.5 ${d.a.cos !== d.b.cos ? 'font-bold text-fail' : ''}`}>{d.b.cos}</td>
                  <td className="px-2 py-0.5">{d.a.sin}</td>
                  <td className={`px-2 py-0.5 ${d.a.sin !== d.b.sin ? 'font-bold text-fail' : ''}`}>{d.b.sin}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {pair.differing > pair.firstDiffering.length && (
            <p className="px-2 py-1 text-xs text-ink-soft">
              The first {pair.firstDiffering.length} of {n(pair.differing)} are listed; the plot shows where all of them are.
            </p>
          )}
        </div>
      )}
    </div>
  );
}

/** The first session against each other one, bit for bit on the codes both answered. */
export function DiffPanel({ sessions, pairs }: { sessions: ComparedSession[]; pairs: ComparedPair[] }) {
  const byId = new Map(sessions.map((s, i) => [s.id, { s, i }]));
  const first = sessions[0];
  const vectoring = first.mode === 'vectoring';
  // Only pairs of the same core were diffed: the plot shows those.
  const diffed = pairs.filter((p) => p.sameCore);
  const names = diffed.map((p) => sessionName(byId.get(p.b)!.s)).join('|');
  const colours = diffed.map((p) => colourOf(byId.get(p.b)!.i)).join('|');
  const options = useMemo(() => {
    const cs = colours.split('|');
    return {
      scales: { x: { time: false } },
      axes: [axis(vectoring ? 'direction of (x, y), °' : 'angle, °'), axis('largest |Δ|, LSB')],
      cursor: { sync: { key: ANGLE_SYNC } },
      legend: { show: false },
      series: [
        { label: 'angle, °' },
        ...names.split('|').map((label, k): uPlot.Series => ({ label, stroke: cs[k], width: 0, paths: () => null, points: { show: true, size: 6, stroke: cs[k], fill: cs[k] } })),
      ],
    };
  }, [names, colours, vectoring]);
  const data = useMemo(() => alignSeries(pairs.filter((p) => p.sameCore).map((p) => diffSeries(p, first))), [pairs, first]);
  const anyDiffer = pairs.some((p) => p.differing > 0);

  return (
    <section aria-labelledby="diff-title" className={`${panel} min-w-0`}>
      <h2 id="diff-title" className={panelTitle}>
        Bit-exact diff against {sessionName(first)}
      </h2>
      <div className="grid gap-4">
        {pairs.map((p) => (vectoring ? <VectorPairSummary key={p.b} pair={p} a={first} b={byId.get(p.b)!.s} /> : <PairSummary key={p.b} pair={p} a={first} b={byId.get(p.b)!.s} />))}
        {anyDiffer && (
          <div>
            <h3 className="mb-1 text-sm font-bold">{vectoring ? 'In which directions the answers differ' : 'Where the codes differ'}</h3>
            <p className="mb-2 text-xs text-ink-soft">
              {vectoring ? 'A point per half-degree of direction holding a differing vector, at the largest difference (angle or magnitude) in it.' : 'A point per half-degree band holding a differing code, at the largest difference in it.'}
            </p>
            <UplotChart options={options} data={data} height={200} testId="compare-diff-chart" />
            <SessionLegend names={diffed.map((p) => sessionName(byId.get(p.b)!.s))} colours={diffed.map((p) => colourOf(byId.get(p.b)!.i))} />
          </div>
        )}
      </div>
    </section>
  );
}
