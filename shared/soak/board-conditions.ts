// A board may report the conditions it runs under at the end of its INFO name, in brackets:
// "Bench board 3 [temperature_c=85; vccint_v=0.95]". The wire protocol stays as it is; a name
// without the brackets, or with text in them that does not read as conditions, reports none.
import { conditionTexts, conditionsFromTexts, type Conditions } from './conditions';

const SUFFIX = /\s*\[([^[\]]*)\]$/;

export function nameWithConditions(name: string, c: Conditions): string {
  const texts = conditionTexts(c);
  return texts.length === 0 ? name : `${name} [${texts.join('; ')}]`;
}

export function conditionsFromBoardName(name: string): { name: string; conditions: Conditions | null } {
  const m = SUFFIX.exec(name);
  if (!m) return { name, conditions: null };
  try {
    const conditions = conditionsFromTexts(m[1].split(';').map((t) => t.trim()).filter(Boolean));
    return { name: name.slice(0, m.index), conditions };
  } catch {
    return { name, conditions: null };
  }
}
