// The save form's operating conditions: the three named ones as numbers and any other
// name=value pairs, checked by the same parser the runner uses, with the caution shown once.
import type { FieldErrors, UseFormRegisterReturn } from 'react-hook-form';
import { z } from 'zod';
import { fieldError, input, label } from '../../../components/ui';
import { conditionsFromTexts, CONDITIONS_CAUTION, type Conditions } from '../../../../shared/soak';

export const conditionFormFields = {
  temperature_c: z.string(),
  vccint_v: z.string(),
  clock_mhz: z.string(),
  otherConditions: z.string(),
};
type ConditionForm = { [K in keyof typeof conditionFormFields]: string };
export const emptyConditionForm: ConditionForm = { temperature_c: '', vccint_v: '', clock_mhz: '', otherConditions: '' };

function texts(v: ConditionForm): string[] {
  const named = (['temperature_c', 'vccint_v', 'clock_mhz'] as const).filter((k) => v[k].trim() !== '').map((k) => `${k}=${v[k].trim()}`);
  const other = v.otherConditions.split(',').map((t) => t.trim()).filter(Boolean);
  return [...named, ...other];
}

/** The conditions the form holds. @throws ConditionError with a message for the user */
export const conditionsOfForm = (v: ConditionForm): Conditions => conditionsFromTexts(texts(v));

/** For the form schema's superRefine: one message, on the field it concerns. */
export function checkConditionForm(v: ConditionForm, ctx: z.RefinementCtx) {
  try {
    conditionsOfForm(v);
  } catch (e) {
    const message = (e as Error).message;
    const field = (['temperature_c', 'vccint_v', 'clock_mhz'] as const).find((k) => message.startsWith(k)) ?? 'otherConditions';
    ctx.addIssue({ code: 'custom', path: [field], message });
  }
}

/** `register`: the form's own, for these four fields. */
export function ConditionFields({ register, errors }: { register: (k: keyof ConditionForm) => UseFormRegisterReturn; errors: FieldErrors<ConditionForm> }) {
  const field = (k: 'temperature_c' | 'vccint_v' | 'clock_mhz', text: string) => (
    <label className={label}>
      {text}
      <input className={input} inputMode="decimal" {...register(k)} />
      {errors[k] && <span className={fieldError}>{errors[k].message}</span>}
    </label>
  );
  return (
    <fieldset className="grid gap-2 rounded border border-rule p-2">
      <legend className="text-sm font-bold">Operating conditions (optional)</legend>
      <p className="text-xs text-ink-soft" role="note">
        {CONDITIONS_CAUTION}
      </p>
      <div className="grid grid-cols-3 gap-2">
        {field('temperature_c', 'Temperature (°C)')}
        {field('vccint_v', 'Supply, VCCINT (V)')}
        {field('clock_mhz', 'Clock (MHz)')}
      </div>
      <label className={label}>
        Other conditions (name=value, comma-separated)
        <input className={input} {...register('otherConditions')} placeholder="chamber=TC-2, airflow=off" />
        {errors.otherConditions && <span className={fieldError}>{errors.otherConditions.message}</span>}
      </label>
    </fieldset>
  );
}
