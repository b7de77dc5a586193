import { sparklinePath } from './sparkline-path';

const W = 96;
const H = 22;

/** A row's error against angle, drawn small; the words say the same for screen readers. */
export function Sparkline({ profile, passed, limitLsb }: { profile: number[] | null | undefined; passed: boolean; limitLsb?: number }) {
  if (!profile || profile.length === 0) return <span className="text-xs text-ink-soft">no profile</span>;
  const s = sparklinePath(profile, W, H, limitLsb);
  if (!s.d) return <span className="text-xs text-ink-soft">no samples</span>;
  const limitY = limitLsb ? H - 1 - (limitLsb / s.topLsb) * (H - 2) : null;
  return (
    <svg width={W} height={H} viewBox={`0 0 ${W} ${H}`} role="img" aria-label={`Largest error per angle bin, up to ${s.maxLsb!.toFixed(2)} LSB`} className="block">
      <rect x="0" y="0" width={W} height={H} className="fill-paper" />
      {limitY !== null && <line x1="0" x2={W} y1={limitY} y2={limitY} className="stroke-rule" strokeDasharray="2 2" />}
      <path d={s.d} fill="none" strokeWidth="1.25" strokeLinejoin="round" className={passed ? 'stroke-reference' : 'stroke-fail'} />
    </svg>
  );
}
