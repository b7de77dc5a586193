// One code's path through two models (the declared one and a hypothesis) as rows side by side,
// and the first row where they part: that is where the defect or the deviation acts.
import type { CordicTrace } from '../../../../shared/numeric';

/** One stage of the evaluation; `values` are shown in order, compared as a whole. */
export interface TraceRow {
  key: string;
  stage: string;
  values: Array<[name: string, value: number | string]>;
}

/** The stages of one evaluation, from reading the angle to the output codes. */
export function traceRows(t: CordicTrace): TraceRow[] {
  const rows: TraceRow[] = [
    { key: 'read', stage: 'angle read', values: [['z', t.zRead]] },
    { key: 'fold', stage: 'folded', values: [['z', t.zStart], ['negate', t.negate ? 'yes' : 'no']] },
    { key: 'start', stage: 'start', values: [['x', t.x0], ['y', 0]] },
  ];
  for (const s of t.steps) {
    rows.push({ key: `step-${s.i}`, stage: `iteration ${s.i}`, values: [['d', s.d > 0 ? '+' : '−'], ['atan', s.atan], ['x', s.x], ['y', s.y], ['z', s.z]] });
  }
  rows.push({ key: 'end', stage: 'after iterations', values: [['x', t.xEnd], ['y', t.yEnd]] });
  rows.push({ key: 'output', stage: 'output', values: [['cos', t.cos], ['sin', t.sin]] });
  return rows;
}

const same = (a: TraceRow | undefined, b: TraceRow | undefined) =>
  !!a && !!b && a.key === b.key && a.values.length === b.values.length && a.values.every(([n, v], i) => b.values[i][0] === n && b.values[i][1] === v);

/** The two traces' rows aligned by stage, and the index of the first stage where they differ (null: they never part). */
export function alignTraces(declared: CordicTrace, hypothesis: CordicTrace): { rows: Array<{ key: string; stage: string; a?: TraceRow; b?: TraceRow }>; parting: number | null } {
  const a = traceRows(declared);
  const b = traceRows(hypothesis);
  const byKeyB = new Map(b.map((r) => [r.key, r]));
  // Stages in the declared order, then any only the hypothesis has (more iterations) before its end.
  const keys = a.map((r) => r.key);
  const extra = b.filter((r) => !keys.includes(r.key)).map((r) => r.key);
  const endAt = keys.indexOf('end');
  keys.splice(endAt, 0, ...extra);
  const byKeyA = new Map(a.map((r) => [r.key, r]));
  const rows = keys.map((key) => {
    const ra = byKeyA.get(key);
    const rb = byKeyB.get(key);
    return { key, stage: (ra ?? rb)!.stage, a: ra, b: rb };
  });
  const parting = rows.findIndex((r) => !same(r.a, r.b));
  return { rows, parting: parting < 0 ? null : parting };
}
