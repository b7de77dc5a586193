import type { UseFormReturn } from 'react-hook-form';
import { panel, panelTitle } from '../../../components/ui';
import { CRC_VARIANTS, type CoreFormValues } from './core-form-schema';
import { LIMIT_KEYS, LIMITS, LINK, MODEL, type ModelKey } from './core-meanings';
import { control, describedBy, FieldShell } from './field-shell';

const NUMERIC_MODEL_KEYS = ['angleBits', 'angleFrac', 'outBits', 'outFrac', 'iterations', 'guardBits', 'zGuardBits'] as const;

/** The editable parts of a core: link profile, reference model and acceptance limits, one panel each. */
export function CoreFields({ form }: { form: UseFormReturn<CoreFormValues> }) {
  const { register, watch, formState } = form;
  const errors = formState.errors;
  const rad = watch('angleFormat') === 'rad';
  const choice = (key: ModelKey, options: readonly string[]) => {
    const id = `core-${key}`;
    const error = errors[key]?.message;
    return (
      <FieldShell key={key} id={id} label={MODEL[key].label} hint={MODEL[key].explain} error={error}>
        <select className={control} {...describedBy(id, error)} {...register(key as 'angleFormat')}>
          {options.map((o) => (
            <option key={o} value={o}>
              {o}
            </option>
          ))}
        </select>
      </FieldShell>
    );
  };
  return (
    <div className="grid gap-4 lg:grid-cols-3">
      <fieldset className={panel}>
        <legend className="sr-only">Link profile</legend>
        <h2 className={panelTitle}>Link profile</h2>
        <div className="grid gap-3">
          <FieldShell id="core-baud" label={LINK.baud.label} unit="bit/s" hint={LINK.baud.explain} error={errors.baud?.message}>
            <input className={control} inputMode="numeric" {...describedBy('core-baud', errors.baud?.message)} {...register('baud')} />
          </FieldShell>
          <FieldShell id="core-crc" label={LINK.crc.label} hint={LINK.crc.explain} error={errors.crc?.message}>
            <select className={control} {...describedBy('core-crc', errors.crc?.message)} {...register('crc')}>
              {CRC_VARIANTS.map((c) => (
                <option key={c}>{c}</option>
              ))}
            </select>
          </FieldShell>
        </div>
      </fieldset>

      <fieldset className={panel}>
        <legend className="sr-only">Reference model</legend>
        <h2 className={panelTitle}>Reference model</h2>
        <div className="grid items-start gap-3 sm:grid-cols-2">
          {choice('angleFormat', ['turn', 'rad'])}
          {NUMERIC_MODEL_KEYS.filter((k) => k !== 'angleFrac' || rad).map((k) => {
            const id = `core-${k}`;
            const error = errors[k]?.message;
            return (
              <FieldShell key={k} id={id} label={MODEL[k].label} hint={MODEL[k].explain} error={error}>
                <input className={control} inputMode="numeric" {...describedBy(id, error)} {...register(k)} />
              </FieldShell>
            );
          })}
          {choice('shiftRounding', ['floor', 'nearest'])}
          {choice('outputRounding', ['truncate', 'nearest'])}
          <div className="grid gap-1 sm:col-span-2">
            <label className="flex items-center gap-2 text-sm font-bold">
              <input type="checkbox" aria-describedby="core-fold-hint" {...register('fold')} />
              {MODEL.fold.label}
            </label>
            <p id="core-fold-hint" className="text-xs text-ink-soft">
              {MODEL.fold.explain}
            </p>
          </div>
        </div>
      </fieldset>

      <fieldset className={panel}>
        <legend className="sr-only">Acceptance limits</legend>
        <h2 className={panelTitle}>Acceptance limits</h2>
        <p className="mb-3 text-xs text-ink-soft">Leave a limit blank to leave it unchecked.</p>
        <div className="grid gap-3">
          {LIMIT_KEYS.map((k) => {
            const id = `core-limit-${k}`;
            const error = errors.limits?.[k]?.message;
            const m = LIMITS[k];
            return (
              <FieldShell key={k} id={id} label={m.label} unit={`${m.unit}, ${m.bound}`} hint={m.explain} error={error}>
                <input className={control} inputMode="decimal" placeholder="not checked" {...describedBy(id, error)} {...register(`limits.${k}`)} />
              </FieldShell>
            );
          })}
        </div>
      </fieldset>
    </div>
  );
}
