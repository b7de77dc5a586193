// `run --condition name=value` (repeatable): the conditions the session ran under, merged over
// whatever the board reports at the end of its INFO name.
import type { DeviceInfo } from '../shared/link';
import { conditionTexts, conditionsFromBoardName, conditionsFromTexts, mergeConditions, type Conditions } from '../shared/soak';
import { UsageError } from './run-options';

export function parseConditionOptions(texts: readonly string[]): Conditions {
  try {
    return conditionsFromTexts(texts);
  } catch (e) {
    throw new UsageError(`--condition: ${(e as Error).message}`);
  }
}

/** The run's conditions: the board's own report, then --condition name by name over it. */
export function runConditions(info: DeviceInfo, given: Conditions): { conditions: Conditions; fromBoard: Conditions | null } {
  const fromBoard = conditionsFromBoardName(info.name).conditions;
  return { conditions: fromBoard ? mergeConditions(fromBoard, given) : given, fromBoard };
}

export function conditionsLine(c: Conditions, fromBoard: Conditions | null): string | null {
  const texts = conditionTexts(c);
  if (texts.length === 0) return null;
  return `conditions ${texts.join(', ')}${fromBoard ? ' (the board reported some in its INFO name; --condition wins)' : ''}`;
}
