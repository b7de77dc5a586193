// `--core-fault` (and a hosted board's `fault=`) read into board settings, one way for both: an
// intermittent fault (flaky:RATE[@SECONDS]) wraps whatever core the board has; anything else is
// read against the catalogue of the board's mode, the rotating one or the vectoring one.
import type { BoardSettings } from './board-session';
import { createSimCore, parseCoreFault } from './faulty-core';
import { isFlakyFaultText, parseFlakyFault } from './flaky-core';
import { createSimVectorCore, parseVectorCoreFault } from './vector-core';

/**
 * Sets the fault `text` on `s` (whose mode, `s.vector` or not, is already chosen) and builds the
 * core once, so a fault the core cannot have is refused now, not at the first connection.
 * @throws Error naming `--core-fault` and what is wrong
 */
export function applyCoreFaultText(s: BoardSettings, text: string): void {
  if (isFlakyFaultText(text)) s.flaky = parseFlakyFault(text);
  else if (s.vector) s.vector = { ...s.vector, fault: parseVectorCoreFault(text) };
  else s.coreFault = parseCoreFault(text);
  if (s.vector) createSimVectorCore(s.vector.core, s.vector.fault);
  else createSimCore(s.core, s.coreFault);
}
