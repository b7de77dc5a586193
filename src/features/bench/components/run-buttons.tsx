import type { BenchController, BenchSnapshot } from '../live/bench-controller';
import { btn, btnPrimary } from '../../../components/ui';

/** Run, Pause, Resume, Abort: the same for either mode's form. */
export function RunButtons({ controller, snap }: { controller: BenchController; snap: BenchSnapshot }) {
  const run = snap.run;
  const active = run?.state === 'running' || run?.state === 'paused';
  return (
    <div className="flex flex-wrap gap-2">
      <button type="submit" className={btnPrimary} disabled={snap.status !== 'connected' || active}>
        Run
      </button>
      <button type="button" className={btn} disabled={run?.state !== 'running'} onClick={() => void controller.pause()}>
        Pause
      </button>
      <button type="button" className={btn} disabled={run?.state !== 'paused'} onClick={() => void controller.resume()}>
        Resume
      </button>
      <button type="button" className={btn} disabled={!active} onClick={() => void controller.abort()}>
        Abort
      </button>
    </div>
  );
}
