// The session page's operating conditions and, for a soak, its timeline (pass → mismatches,
// unstable codes, link errors) and its unstable codes against angle. SVG, so it prints.
import { panel, panelTitle } from '../../../components/ui';
import { UnstableCodesTable } from '../../../components/unstable-codes-table';
import { angleCodeToDegrees, parseModelConfig } from '../../../../shared/numeric';
import { CONDITION_RANGES, NAMED_CONDITIONS, type Conditions, type SoakRecord, type SoakTimelinePoint } from '../../../../shared/soak';

const n = (v: number) => v.toLocaleString('en-US');

function ConditionList({ conditions }: { conditions: Conditions }) {
  const named = NAMED_CONDITIONS.filter((k) => conditions[k] !== undefined);
  const other = Object.entries(conditions.other ?? {});
  if (named.length === 0 && other.length === 0) return <p className="text-sm text-ink-soft">No operating conditions were recorded with this session.</p>;
  return (
    <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm" aria-label="Recorded conditions">
      {named.map((k) => (
        <div key={k} className="contents">
          <dt className="text-ink-soft">{CONDITION_RANGES[k].label}</dt>
          <dd>
            {conditions[k]} {CONDITION_RANGES[k].unit}
          </dd>
        </div>
      ))}
      {other.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-ink-soft">{k}</dt>
          <dd>{v}</dd>
        </div>
      ))}
    </dl>
  );
}

const W = 560;
const H = 200;
const PAD = { l: 48, r: 12, t: 10, b: 34 };
const LINES: Array<{ key: 'mismatches' | 'unstableCodes' | 'linkErrors'; label: string; color: string }> = [
  { key: 'mismatches', label: 'Model mismatches', color: '#a8402f' },
  { key: 'unstableCodes', label: 'Unstable codes so far', color: '#c9821e' },
  { key: 'linkErrors', label: 'Link errors', color: '#2f8b82' },
];

function Timeline({ points }: { points: SoakTimelinePoint[] }) {
  const last = points[points.length - 1];
  const lastPass = last.pass + last.passes - 1;
  const top = Math.max(1, ...points.flatMap((p) => LINES.map((l) => p[l.key])));
  const px = (pass: number) => PAD.l + (lastPass === 1 ? 0.5 : (pass - 1) / (lastPass - 1)) * (W - PAD.l - PAD.r);
  const py = (v: number) => H - PAD.b - (v / top) * (H - PAD.t - PAD.b);
  return (
    <figure className="grid gap-1">
      <svg role="img" aria-label="Soak timeline: pass against mismatches, unstable codes and link errors" viewBox={`0 0 ${W} ${H}`} className="w-full max-w-2xl">
        <line x1={PAD.l} y1={H - PAD.b} x2={W - PAD.r} y2={H - PAD.b} stroke="currentColor" strokeOpacity={0.4} />
        <line x1={PAD.l} y1={PAD.t} x2={PAD.l} y2={H - PAD.b} stroke="currentColor" strokeOpacity={0.4} />
        <text x={PAD.l - 6} y={py(top) + 4} textAnchor="end" fontSize={11}>
          {n(top)}
        </text>
        <text x={PAD.l - 6} y={py(0) + 4} textAnchor="end" fontSize={11}>
          0
        </text>
        <text x={px(1)} y={H - PAD.b + 14} textAnchor="middle" fontSize={11}>
          1
        </text>
        <text x={px(lastPass)} y={H - PAD.b + 14} textAnchor="middle" fontSize={11}>
          {n(lastPass)}
        </text>
        <text x={(W + PAD.l) / 2} y={H - 4} textAnchor="middle" fontSize={12}>
          Pass
        </text>
        {LINES.map((l) => (
          <polyline key={l.key} fill="none" stroke={l.color} strokeWidth={2} points={points.map((p) => `${px(p.pass + p.passes - 1)},${py(p[l.key])}`).join(' ')} />
        ))}
      </svg>
      <figcaption className="flex flex-wrap gap-3 text-sm">
        {LINES.map((l) => (
          <span key={l.key} className="flex items-center gap-1">
            <span aria-hidden className="inline-block h-2 w-4" style={{ background: l.color }} />
            {l.label}
          </span>
        ))}
        {points.some((p) => p.passes > 1) && <span className="text-ink-soft">(neighbouring passes merged: each point sums its passes)</span>}
      </figcaption>
    </figure>
  );
}

/** Each listed unstable code at its angle, as high as its answers spread (in LSB). */
function UnstableAgainstAngle({ soak, modelConfig }: { soak: SoakRecord; modelConfig: unknown }) {
  let config;
  try {
    config = parseModelConfig(modelConfig ?? {});
  } catch {
    return null;
  }
  const dots = soak.unstable.codes.map((u) => {
    const spread = Math.max(...u.answers.flatMap((a) => [Math.abs(a.cos - u.answers[0].cos), Math.abs(a.sin - u.answers[0].sin)]));
    return { code: u.code, deg: ((angleCodeToDegrees(config, u.code) % 360) + 360) % 360, spread };
  });
  const top = Math.max(1, ...dots.map((d) => d.spread));
  const px = (deg: number) => PAD.l + (deg / 360) * (W - PAD.l - PAD.r);
  const py = (v: number) => H - PAD.b - (Math.log2(1 + v) / Math.log2(1 + top)) * (H - PAD.t - PAD.b);
  return (
    <figure className="grid gap-1">
      <svg role="img" aria-label={`Unstable codes against angle: ${dots.length} codes`} viewBox={`0 0 ${W} ${H}`} className="w-full max-w-2xl">
        <line x1={PAD.l} y1={H - PAD.b} x2={W - PAD.r} y2={H - PAD.b} stroke="currentColor" strokeOpacity={0.4} />
        <line x1={PAD.l} y1={PAD.t} x2={PAD.l} y2={H - PAD.b} stroke="currentColor" strokeOpacity={0.4} />
        {[0, 90, 180, 270, 360].map((d) => (
          <text key={d} x={px(d)} y={H - PAD.b + 14} textAnchor="middle" fontSize={11}>
            {d}°
          </text>
        ))}
        <text x={PAD.l - 6} y={py(top) + 4} textAnchor="end" fontSize={11}>
          {n(top)}
        </text>
        <text x={PAD.l - 6} y={py(0) + 4} textAnchor="end" fontSize={11}>
          0
        </text>
        <text x={(W + PAD.l) / 2} y={H - 4} textAnchor="middle" fontSize={12}>
          Angle (spread of answers in LSB, log scale)
        </text>
        {dots.map((d) => (
          <circle key={d.code} cx={px(d.deg)} cy={py(d.spread)} r={3} fill="#c9821e">
            <title>{`code ${d.code} (${d.deg.toFixed(2)}°): answers spread over ${d.spread} LSB`}</title>
          </circle>
        ))}
      </svg>
    </figure>
  );
}

export function SoakPanel({ conditions, soak, modelConfig }: { conditions: Conditions | undefined; soak: SoakRecord | null | undefined; modelConfig: unknown }) {
  return (
    <section aria-labelledby="soak-title" className={panel}>
      <h2 id="soak-title" className={panelTitle}>
        {soak ? 'Conditions and soak' : 'Operating conditions'}
      </h2>
      <ConditionList conditions={conditions ?? {}} />
      {soak && (
        <div className="mt-3 grid gap-3">
          <p className="text-sm" data-testid="soak-summary">
            {n(soak.summary.passes)} passes of {n(soak.summary.codesPerPass)} codes in {(soak.summary.elapsedMs / 1000).toFixed(1)} s: {n(soak.summary.mismatches)} model mismatches in all,{' '}
            {n(soak.summary.linkErrors)} link errors, <strong>{n(soak.unstable.count)} unstable codes</strong>. The figures above are the last pass.
          </p>
          <Timeline points={soak.timeline} />
          {soak.unstable.count > 0 && (
            <>
              <UnstableAgainstAngle soak={soak} modelConfig={modelConfig} />
              <UnstableCodesTable codes={soak.unstable.codes.slice(0, 12)} label="Unstable codes" />
              {soak.unstable.count > 12 && <p className="text-xs text-ink-soft">The first 12 of {n(soak.unstable.count)} are listed; the JSON download holds {soak.unstable.listed < soak.unstable.count ? `the first ${n(soak.unstable.listed)}` : 'them all'}.</p>}
            </>
          )}
        </div>
      )}
    </section>
  );
}
