// The simulated board's soak options, parsed apart from the other fault texts: `--condition
// name=value` (repeatable), reported at the end of the INFO name.
import { conditionsFromTexts, nameWithConditions, type Conditions } from '../shared/soak';
import { INFO_FIXED_BYTES, MAX_PAYLOAD } from '../shared/link/wire-profile';

export { isFlakyFaultText, parseFlakyFault } from './flaky-core';

export function boardConditionArgs(texts: string[], name: string): { conditions?: Conditions } {
  if (texts.length === 0) return {};
  let conditions: Conditions;
  try {
    conditions = conditionsFromTexts(texts);
  } catch (e) {
    throw new Error(`--condition: ${(e as Error).message}`);
  }
  const full = nameWithConditions(name, conditions);
  const room = MAX_PAYLOAD - INFO_FIXED_BYTES;
  if (full.length > room) throw new Error(`--condition: the name with its conditions is ${full.length} characters, INFO holds ${room}`);
  return { conditions };
}
