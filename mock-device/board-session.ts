// One connection to the simulated board: the protocol logic, paced to the line rate, with the
// line faults applied on the way to the host. Transport-free, so tests run it in-process.
import { createSimCore, type CoreFault } from './faulty-core';
import { createFlakyCore, type CoreFlip, type FlakyFault } from './flaky-core';
import { LineFaults, noLineFaults, type LineFaultSettings } from './line-faults';
import { LinePacer, realClock, type PacerClock } from './line-pacer';
import { DEFAULT_LINE_LOW_MARK, SimulatedBoard } from './simulated-board';
import type { Crc8Name } from '../shared/link/crc8';
import type { ModelConfigInput } from '../shared/numeric';
import { nameWithConditions, type Conditions } from '../shared/soak';
import type { VectorConfigInput } from '../shared/vectoring';
import { createSimVectorCore, type VectorDeviation } from './vector-core';
import { createFlakyVectorCore, type VectorCoreFlip } from './flaky-vector-core';

export interface BoardSettings {
  core: ModelConfigInput;
  /**
   * A vectoring board instead (`--mode vectoring`): its configuration and core fault. `core` and
   * `coreFault` are then unused; `flaky` flips its angle or magnitude bits.
   */
  vector?: { core: VectorConfigInput; fault?: VectorDeviation };
  coreFault?: CoreFault;
  queueDepth: number;
  buildId: number;
  clockKHz: number;
  name: string;
  baud: number;
  lineFaults: LineFaultSettings;
  /** The frame check (default CRC-8/SMBUS, as the protocol's). */
  crc?: Crc8Name;
  /** An intermittent defect on top of the core (and of any coreFault). */
  flaky?: FlakyFault;
  /** Seeds the flaky core's draws. */
  seed?: number;
  /** Every answer the flaky core got wrong, as it happens: the board's own record of its flips. */
  onCoreFlip?: (flip: CoreFlip) => void;
  /** The same record for a vectoring board's flips. */
  onVectorFlip?: (flip: VectorCoreFlip) => void;
  /** Conditions the board reports, at the end of its INFO name (shared/soak/board-conditions.ts). */
  conditions?: Conditions;
}

export const defaultBoardSettings = (): BoardSettings => ({
  core: {},
  queueDepth: 256,
  buildId: 0x2026_0001,
  clockKHz: 200_000,
  name: 'Anglebench simulated board',
  baud: 3_000_000,
  lineFaults: noLineFaults,
});

export interface BoardSession {
  /** Bytes from the host. */
  receive(bytes: Uint8Array): void;
  /** Stop producing and drop whatever waits on the line. */
  close(): void;
  readonly faults: LineFaults;
}

export function openBoardSession(settings: BoardSettings, deliver: (bytes: Uint8Array) => void, clock: PacerClock = realClock): BoardSession {
  const faults = new LineFaults(settings.lineFaults);
  let releaseAt = 0;
  let closed = false;
  const out = (chunk: Uint8Array) => {
    const bytes = faults.corrupt(chunk);
    if (bytes.length === 0) return;
    const delay = faults.jitter();
    if (delay === 0 && releaseAt <= clock.now()) return deliver(bytes);
    // Jitter delays chunks but never reorders them: each leaves no earlier than the one before.
    releaseAt = Math.max(releaseAt, clock.now() + delay);
    clock.after(releaseAt - clock.now(), () => !closed && deliver(bytes));
  };
  const holder: { board?: SimulatedBoard } = {};
  const pacer = new LinePacer({
    baud: settings.baud,
    clock,
    emit: (chunk) => {
      out(chunk);
      holder.board!.fill(pacer.queuedBytes);
    },
  });
  const board = (holder.board = new SimulatedBoard({
    core: simCore(settings, clock),
    queueDepth: settings.queueDepth,
    buildId: settings.buildId,
    clockKHz: settings.clockKHz,
    name: settings.conditions ? nameWithConditions(settings.name, settings.conditions) : settings.name,
    crc: settings.crc,
    lineLowMark: lineLowMark(settings.baud),
    send: (bytes) => {
      pacer.write(bytes);
      return pacer.queuedBytes;
    },
  }));
  return {
    faults,
    receive: (bytes) => !closed && board.receive(bytes),
    close: () => {
      closed = true;
      pacer.stop();
    },
  };
}

function simCore(settings: BoardSettings, clock: PacerClock) {
  if (settings.vector) {
    const vector = createSimVectorCore(settings.vector.core, settings.vector.fault);
    if (!settings.flaky) return { vector };
    return { vector: createFlakyVectorCore(vector, settings.flaky, { seed: settings.seed ?? 1, now: () => clock.now(), onFlip: settings.onVectorFlip }) };
  }
  const core = createSimCore(settings.core, settings.coreFault);
  if (!settings.flaky) return core;
  return createFlakyCore(core, settings.flaky, { seed: settings.seed ?? 1, now: () => clock.now(), onFlip: settings.onCoreFlip });
}

/**
 * 10 ms of line at the board's rate (1 KiB at the least): enough that a late timer does not leave
 * the line idle, little enough that a PAUSE still stops the results within about 10 ms.
 */
export function lineLowMark(baud: number): number {
  return Math.max(DEFAULT_LINE_LOW_MARK, Math.round(baud / 10 / 100));
}
