// The plan forms' shared parts (RotationRunForm in run-panel.tsx, VectorRunForm): the selects,
// the code fields with their problems, the profile to score against, and how a problem is told.
import { useState, type ReactNode } from 'react';
import type { UseFormRegisterReturn } from 'react-hook-form';
import { PlanError } from '../../../../shared/numeric';
import { fieldError, input, label } from '../../../components/ui';

/** A problem with the form, by the field it is about, or null for one said above the buttons. */
export type PlanProblem<F extends string> = { field: F | 'profile' | null; message: string };

/** The form's problem: set from what went wrong, shown by `err(field)` or ProblemAlert. */
export function usePlanProblem<F extends string>() {
  const [problem, setProblem] = useState<PlanProblem<F> | null>(null);
  return {
    problem,
    setProblem,
    err: (f: F | 'profile') => problem?.field === f && <span className={fieldError}>{problem.message}</span>,
    /** The profile text as a configuration, or null with the problem said by it. */
    readProfile<C>(text: string, parse: (raw: unknown) => C): C | null {
      try {
        return parse(JSON.parse(text));
      } catch (e) {
        setProblem({ field: 'profile', message: `Core profile: ${(e as Error).message}` });
        return null;
      }
    },
    /** A plan the form or the plan's binding refused, said by the field it is about where there is one. */
    planFailed(e: unknown, FieldError: abstract new (...args: never[]) => { field: F; message: string }, fieldOf: (key: string) => F | null) {
      if (e instanceof FieldError) setProblem({ field: e.field, message: e.message });
      else if (e instanceof PlanError) {
        // Shown by the field it is about, without the plan's own key in front.
        const field = fieldOf(e.key);
        setProblem({ field, message: field ? e.message.slice(e.key.length + 2) : e.message });
      } else setProblem({ field: null, message: (e as Error).message });
    },
  };
}

export function ProblemAlert({ problem }: { problem: PlanProblem<string> | null }) {
  if (!problem || problem.field !== null) return null;
  return (
    <p role="alert" className="text-sm text-fail">
      {problem.message}
    </p>
  );
}

/** A choice of the form (what kind of plan, which unit): a select over [value, words] pairs. */
export function OptionSelect({ caption, options, reg }: { caption: string; options: ReadonlyArray<readonly [string, string]>; reg: UseFormRegisterReturn }) {
  return (
    <label className={`${label} col-span-2`}>
      {caption}
      <select className={input} {...reg}>
        {options.map(([k, text]) => (
          <option key={k} value={k}>
            {text}
          </option>
        ))}
      </select>
    </label>
  );
}

/** A field of codes or numbers, its problem under it; `rows` makes it a text area, `wide` spans the form. */
export function CodeField({ caption, reg, error, wide = false, rows }: { caption: string; reg: UseFormRegisterReturn; error: ReactNode; wide?: boolean; rows?: number }) {
  return (
    <label className={wide ? `${label} col-span-2` : label}>
      {caption}
      {rows ? <textarea rows={rows} className={`${input} font-mono`} {...reg} /> : <input className={`${input} font-mono`} {...reg} />}
      {error}
    </label>
  );
}

/** The profile to score against, as JSON, folded away. */
export function ProfileEditor({ summary, name, rows, value, onChange }: { summary: string; name: string; rows: number; value: string; onChange: (text: string) => void }) {
  return (
    <details className="col-span-2 text-sm">
      <summary className="cursor-pointer text-ink-soft">{summary}</summary>
      <textarea aria-label={name} rows={rows} className={`${input} mt-1 font-mono text-xs`} value={value} onChange={(e) => onChange(e.target.value)} />
    </details>
  );
}
