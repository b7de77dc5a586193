import { useMemo, type ReactNode } from 'react';
import type uPlot from 'uplot';
import { panel, panelTitle } from '../../../components/ui';
import type { ComparedPair, ComparedSession } from '../api/compare-types';
import { alignSeries, diffSeries, sessionName } from './chart-data';
import { ANGLE_SYNC, axis, colourOf } from './chart-look';
import { SessionLegend } from './session-legend';
import { UplotChart } from './uplot-chart';

const n = (v: number) => v.toLocaleString('en-US');

/** One cell of a differing row; `differs` marks the second session's answer where it is not the first's. */
type DiffCell = { text: string | number; differs?: boolean };

/** What a pair's summary says and lists, in the words of its mode. */
interface PairWords {
  /** What the sessions asked: "codes" or "vectors". */
  noun: string;
  /** What another core's codes stand for (the pair is then not compared). */
  otherMeaning: string;
  noneInCommon: string;
  /** The largest differences, said after "; "; null when the reply has no figures to say. */
  largest: ReactNode | null;
  order: string;
  headers: string[];
  rows: Array<{ key: string | number; cells: DiffCell[] }>;
  /** The note under a list cut short: what the plot shows. */
  plotShows: string;
}

/** A rotation pair: angle codes, cos and sin. */
function rotationWords(pair: ComparedPair, a: ComparedSession, b: ComparedSession): PairWords {
  return {
    noun: 'codes',
    otherMeaning: 'stand for other angles and values',
    noneInCommon: 'No code in common: these sessions answered different angle codes, so nothing can be compared bit for bit.',
    largest: (
      <>
        the largest difference is <strong>{n(pair.maxAbsDiffLsb)} LSB</strong>.
      </>
    ),
    order: 'code order',
    headers: ['Code', 'Angle, °', `cos ${sessionName(a)}`, `cos ${sessionName(b)}`, `sin ${sessionName(a)}`, `sin ${sessionName(b)}`],
    rows: pair.firstDiffering.map((d) => ({
      key: d.code,
      cells: [{ text: d.code }, { text: d.degrees.toFixed(4) }, { text: d.a.cos }, { text: d.b.cos, differs: d.a.cos !== d.b.cos }, { text: d.a.sin }, { text: d.b.sin, differs: d.a.sin !== d.b.sin }],
    })),
    plotShows: 'where all of them are',
  };
}

/** A vectoring pair: (x, y) vectors, the largest angle and magnitude differences. */
function vectorWords(pair: ComparedPair, a: ComparedSession, b: ComparedSession): PairWords {
  const v = pair.vector;
  return {
    noun: 'vectors',
    otherMeaning: 'mean other angles and magnitudes',
    noneInCommon: 'No vector in common: these sessions asked different (x, y) pairs, so nothing can be compared bit for bit.',
    largest: v ? (
      <>
        the largest differences are <strong>{n(v.maxAbsAngleDiffLsb)} LSB</strong> of angle and <strong>{n(v.maxAbsMagnitudeDiffLsb)} LSB</strong> of magnitude.
      </>
    ) : null,
    order: '(x, y) order',
    headers: ['x', 'y', 'Direction, °', `angle ${sessionName(a)}`, `angle ${sessionName(b)}`, `magnitude ${sessionName(a)}`, `magnitude ${sessionName(b)}`],
    rows: (v?.firstDiffering ?? []).map((d) => ({
      key: `${d.x},${d.y}`,
      cells: [
        { text: d.x },
        { text: d.y },
        { text: d.degrees.toFixed(3) },
        { text: d.a.angle },
        { text: d.b.angle, differs: d.a.angle !== d.b.angle },
        { text: d.a.magnitude },
        { text: d.b.magnitude, differs: d.a.magnitude !== d.b.magnitude },
      ],
    })),
    plotShows: 'in which directions all of them lie',
  };
}

/** One pair against the reference: the count of differing answers and the first of them. */
function PairSummary({ pair, a, b, words: w }: { pair: ComparedPair; a: ComparedSession; b: ComparedSession; words: PairWords }) {
  const title = `${sessionName(b)} against ${sessionName(a)}`;
  return (
    <div className="grid gap-2" data-testid={`diff-${pair.b}`}>
      <h3 className="font-bold">{title}</h3>
      {!pair.sameCore ? (
        <p className="text-sm" data-testid={`diff-summary-${pair.b}`}>
          Not compared bit for bit: this session is of {b.core.name ?? 'another core'}, whose codes {w.otherMeaning} than those of {a.core.name ?? 'the reference’s core'}.
        </p>
      ) : pair.common === 0 ? (
        <p className="text-sm" data-testid={`diff-summary-${pair.b}`}>
          {w.noneInCommon}
        </p>
      ) : (
        <p className="text-sm" data-testid={`diff-summary-${pair.b}`}>
          <strong className={pair.differing ? 'text-fail' : 'text-pass'} data-testid={`diff-count-${pair.b}`}>
            {n(pair.differing)}
          </strong>{' '}
          of {n(pair.common)} {w.noun} both answered differ
          {pair.differing > 0 && w.largest ? <>; {w.largest}</> : ': bit for bit the same.'}
        </p>
      )}
      {w.rows.length > 0 && (
        // Scrolls on its own: focusable and named, so a keyboard can reach and scroll it.
        <div tabIndex={0} role="region" aria-label={`First differing ${w.noun}, ${title} (scrolls)`} className="max-h-64 overflow-auto rounded border border-rule">
          <table className="w-full text-xs" aria-label={`First differing ${w.noun}, ${title}`}>
            <caption className="sr-only">
              The first {w.rows.length} differing {w.noun} in {w.order}
            </caption>
            <thead className="sticky top-0 bg-panel text-left text-ink-soft">
              <tr>
                {w.headers.map((h) => (
                  <th key={h} scope="col" className="px-2 py-1 text-right font-bold">
                    {h}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody className="font-mono">
              {w.rows.map((r) => (
                <tr key={r.key} className="border-t border-rule/60 text-right">
                  {r.cells.map((c, k) => (
                    <td key={k} className={c.differs === undefined ? 'px-2 py-0.5' : `px-2 py-0.5 ${c.differs ? 'font-bold text-fail' : ''}`}>
                      {c.text}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
          {pair.differing > w.rows.length && (
            <p className="px-2 py-1 text-xs text-ink-soft">
              The first {w.rows.length} of {n(pair.differing)} are listed; the plot shows {w.plotShows}.
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
        {pairs.map((p) => {
          const b = byId.get(p.b)!.s;
          return <PairSummary key={p.b} pair={p} a={first} b={b} words={(vectoring ? vectorWords : rotationWords)(p, first, b)} />;
        })}
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
