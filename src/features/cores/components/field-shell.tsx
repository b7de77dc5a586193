import type { ReactNode } from 'react';
import { fieldError, input, label as labelClass } from '../../../components/ui';

/** The shared input look, with a red edge while the field is refused. */
export const control = `${input} aria-[invalid=true]:border-fail`;

/**
 * One labelled field: the control (given as children, so react-hook-form's register stays on the
 * element), a one-line explanation and the field's error, both tied to the control by id.
 */
export function FieldShell({ id, label, unit, hint, error, children }: { id: string; label: string; unit?: string; hint: string; error?: string; children: ReactNode }) {
  return (
    <div className="grid content-start gap-1">
      <label htmlFor={id} className={`${labelClass} font-bold`}>
        <span>
          {label}
          {unit && <span className="ml-1 font-normal text-ink-soft">({unit})</span>}
        </span>
      </label>
      {children}
      <p id={`${id}-hint`} className="text-xs text-ink-soft">
        {hint}
      </p>
      {error && (
        <p id={`${id}-error`} className={fieldError}>
          {error}
        </p>
      )}
    </div>
  );
}

/** aria props for a control inside FieldShell. */
export const describedBy = (id: string, error?: string) => ({
  id,
  'aria-describedby': error ? `${id}-hint ${id}-error` : `${id}-hint`,
  'aria-invalid': error ? true : undefined,
});
