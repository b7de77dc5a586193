import type { LinkFigures } from '../../../../shared/link-engine/link-figures';

const n = (v: number, digits = 3) => (Number.isFinite(v) ? v.toFixed(digits) : '—');
const int = (v: number) => v.toLocaleString('en-US');

/** What the link did during the run, under either mode's figures. */
export function LinkFiguresList({ figures: f }: { figures: LinkFigures }) {
  const naks = Object.values(f.naks).reduce((a, b) => a + b, 0);
  return (
    <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 border-t border-rule pt-3 text-sm">
      <dt className="text-ink-soft">Frames out / in</dt>
      <dd className="font-mono">
        {int(f.framesSent)} / {int(f.framesReceived)}
      </dd>
      <dt className="text-ink-soft">Bytes out / in</dt>
      <dd className="font-mono">
        {int(f.bytesSent)} / {int(f.bytesReceived)}
      </dd>
      <dt className="text-ink-soft">Line use</dt>
      <dd className="font-mono">{n(f.lineShare * 100, 1)} %</dd>
      <dt className="text-ink-soft">Bad CHECK / skipped</dt>
      <dd className="font-mono">
        {int(f.checkFailures)} / {int(f.skippedBytes)} B
      </dd>
      <dt className="text-ink-soft">NAKs / retries</dt>
      <dd className="font-mono">
        {int(naks)} / {int(f.retries)}
      </dd>
      <dt className="text-ink-soft" title="Answers off the model that arrived on a damaged line, asked for again before they were taken">
        Confirmed again
      </dt>
      <dd className="font-mono">
        {int(f.confirmations ?? 0)}
        {(f.unconfirmed ?? 0) > 0 && <span className="text-fail"> ({int(f.unconfirmed)} not)</span>}
      </dd>
    </dl>
  );
}
