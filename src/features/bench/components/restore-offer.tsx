import type { BenchController, BenchSnapshot } from '../live/bench-controller';
import { btn, btnPrimary, panel } from '../../../components/ui';

const when = (ms: number) => new Date(ms).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' });

/** An unsaved run from an earlier visit, offered back; and any problem keeping it. */
export function RestoreOffer({ controller, snap }: { controller: BenchController; snap: BenchSnapshot }) {
  const r = snap.restorable;
  if (!r && !snap.storeMessage) return null;
  return (
    <section aria-label="Unsaved run" className={`${panel} grid gap-2 border-signal`}>
      {r && (
        <>
          <p className="text-sm">
            This browser kept an unsaved run ({r.plan.kind}, {r.answered.toLocaleString('en-US')} results).
          </p>
          <div className="flex flex-wrap gap-2">
            <button type="button" className={btnPrimary} onClick={() => void controller.restoreUnsaved()}>
              Restore unsaved run from {when(r.storedAt)}
            </button>
            <button type="button" className={btn} onClick={() => void controller.forgetUnsaved()}>
              Discard
            </button>
          </div>
        </>
      )}
      {snap.storeMessage && (
        <p role="alert" className="text-sm text-fail">
          {snap.storeMessage}
        </p>
      )}
    </section>
  );
}
