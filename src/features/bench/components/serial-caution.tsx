import { useEffect, useRef } from 'react';
import { btn, btnPrimary } from '../../../components/ui';

const KEY = 'anglebench.serialCautionSeen';

export const serialCautionSeen = () => {
  try {
    return localStorage.getItem(KEY) === '1';
  } catch {
    return false;
  }
};

/** Shown once before the first serial connect; the answer is remembered in localStorage. */
export function SerialCaution({ onGoOn, onCancel }: { onGoOn: () => void; onCancel: () => void }) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const d = ref.current;
    d?.showModal();
    return () => d?.close();
  }, []);
  return (
    <dialog ref={ref} onCancel={onCancel} aria-labelledby="serial-caution-title" className="m-auto max-w-lg rounded-lg border border-rule bg-panel p-6 text-ink backdrop:bg-ink/50">
      <h2 id="serial-caution-title" className="mb-3 text-xl font-bold">
        Before the first serial connection
      </h2>
      <ul className="mb-5 list-disc space-y-2 pl-5">
        <li>Check the USB–UART adapter's logic level against the I/O bank voltage of the board's UART pins. A 5 V adapter on a 1.8 V or 3.3 V bank can damage the FPGA.</li>
        <li>Connect ground first. DTR and RTS may be wired to reset or boot pins on some boards.</li>
        <li>Your lab's ESD and equipment rules come first, before anything this page says.</li>
      </ul>
      <div className="flex justify-end gap-2">
        <button type="button" className={btn} onClick={onCancel}>
          Not now
        </button>
        <button
          type="button"
          className={btnPrimary}
          autoFocus
          onClick={() => {
            try {
              localStorage.setItem(KEY, '1');
            } catch {
              // Private mode: ask again next time.
            }
            onGoOn();
          }}
        >
          Checked — connect
        </button>
      </div>
    </dialog>
  );
}
