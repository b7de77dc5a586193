import type { BuildStatus } from '../../../lib/resources/builds';
import { STATUS_LOOK } from './build-format';

/** A build's status in words on its colour; `large` for the build page's heading. */
export function StatusBadge({ status, large = false }: { status: BuildStatus; large?: boolean }) {
  const look = STATUS_LOOK[status];
  const size = large ? 'px-3 py-1 text-base' : 'px-2 py-0.5 text-xs';
  return (
    <span data-testid="build-status" title={look.hint} className={`inline-block rounded border font-bold uppercase tracking-wider ${size} ${look.className}`}>
      {look.words}
    </span>
  );
}
