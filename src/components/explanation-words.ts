// The words every page uses for an explanation of a session's answers (shared/explain), so the
// session page, the printed report and the compare page say the same thing.
import type { Explanation, HypothesisRef } from '../../shared/explain';

const count = (n: number) => n.toLocaleString('en-US');

/** The outcome as a short heading. */
export function outcomeHeading(e: Pick<Explanation, 'outcome' | 'rest'>): string {
  switch (e.outcome) {
    case 'matches-model':
      return 'The core matches its model';
    case 'explained':
      return 'Explained';
    case 'partly-explained':
      return e.rest === 'scattered'
        ? 'Nearly explained — the rest looks scattered (a damaged line or an unstable core)'
        : e.rest === 'structured'
          ? 'Nearly explained — the rest looks structured (a second defect?)'
          : 'Partly explained';
    case 'unexplained':
      return 'Not explained by any single hypothesis';
  }
}

/** Whether the outcome is good news, bad news, or in between (for colour). */
export function outcomeTone(e: Pick<Explanation, 'outcome'>): 'pass' | 'warn' | 'fail' {
  return e.outcome === 'matches-model' ? 'pass' : e.outcome === 'explained' ? 'warn' : 'fail';
}

/** "reproduces 65,536 of 65,536 answers exactly; largest difference left 0 LSB". */
export function reproducedWords(h: { exact: number; maxDiffLsb: number }, answered: number): string {
  const all = h.exact === answered;
  return `reproduces ${count(h.exact)} of ${count(answered)} answers exactly${all ? '' : `; largest difference left ${count(h.maxDiffLsb)} LSB`}`;
}

/** The labels of the hypotheses giving identical answers, listed together: the first `shown`, then how many more. */
export function equivalentWords(equivalent: readonly Pick<HypothesisRef, 'label'>[], shown = 3): string {
  if (equivalent.length === 0) return '';
  const more = equivalent.length - shown;
  return `same answers as: ${equivalent.slice(0, shown).map((h) => h.label).join('; ')}${more > 0 ? ` and ${more} more` : ''}`;
}

/** The keys a configuration changes, "iterations 16 → 12", in the model's key order. */
export function configChanges(from: object, to: object): string[] {
  const a = from as Record<string, unknown>;
  const b = to as Record<string, unknown>;
  return Object.keys(b)
    .filter((k) => JSON.stringify(a[k]) !== JSON.stringify(b[k]))
    .map((k) => `${k} ${JSON.stringify(a[k])} → ${JSON.stringify(b[k])}`);
}
