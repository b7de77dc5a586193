import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { ApiError } from '../../../lib/api';
import { btn, btnPrimary, fieldError, input, label, panel, panelTitle } from '../../../components/ui';
import { newBuildSchema, useCreateBuild, type NewBuildForm } from '../api/create-build';
import { useCores } from '../../../lib/resources/cores';

const FIELDS: Array<{ name: Exclude<keyof NewBuildForm, 'coreId' | 'notes'>; label: string; placeholder: string; mono?: boolean }> = [
  { name: 'label', label: 'Label', placeholder: 'ref16-r4' },
  { name: 'sourceRevision', label: 'Source revision', placeholder: 'commit or tag', mono: true },
  { name: 'toolVersion', label: 'Tool version', placeholder: 'synth 2025.1' },
  { name: 'clockMHz', label: 'Clock, MHz', placeholder: '200' },
];

/** An engineer's form for a new build of a core; opens the build once it is made. */
export function NewBuildForm({ coreId, onCancel }: { coreId: number | null; onCancel: () => void }) {
  const cores = useCores();
  const create = useCreateBuild();
  const navigate = useNavigate();
  const { register, handleSubmit, formState, setValue } = useForm<NewBuildForm>({
    resolver: zodResolver(newBuildSchema),
    defaultValues: { coreId: coreId === null ? '' : String(coreId), label: '', sourceRevision: '', toolVersion: '', clockMHz: '', notes: '' },
  });
  // The select only takes the filtered core once its options exist.
  useEffect(() => {
    if (cores.data && coreId !== null) setValue('coreId', String(coreId));
  }, [cores.data, coreId, setValue]);
  const errors = formState.errors;
  const submit = (v: NewBuildForm) => create.mutate(v, { onSuccess: (b) => navigate(`/builds/${b.id}`) });

  return (
    <form noValidate onSubmit={handleSubmit(submit)} aria-label="New build" className={panel}>
      <h2 className={panelTitle}>New build</h2>
      <fieldset disabled={create.isPending} className="grid gap-3 md:grid-cols-3">
        <label className={label}>
          Core
          <select className={input} {...register('coreId')}>
            <option value="">{cores.isPending ? 'Loading cores…' : 'Choose a core'}</option>
            {cores.data?.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name} ({c.slug})
              </option>
            ))}
          </select>
          {errors.coreId && <span className={fieldError}>{errors.coreId.message}</span>}
          {cores.isError && <span className={fieldError}>The cores could not be loaded: {cores.error.message}</span>}
        </label>
        {FIELDS.map((f) => (
          <label key={f.name} className={label}>
            {f.label}
            <input className={`${input} ${f.mono ? 'font-mono' : ''}`} placeholder={f.placeholder} inputMode={f.name === 'clockMHz' ? 'decimal' : undefined} {...register(f.name)} />
            {errors[f.name] && <span className={fieldError}>{errors[f.name]?.message}</span>}
          </label>
        ))}
        <label className={`${label} md:col-span-3`}>
          Notes
          <textarea className={input} rows={2} {...register('notes')} />
          {errors.notes && <span className={fieldError}>{errors.notes.message}</span>}
        </label>
      </fieldset>
      {create.isError && (
        <p role="alert" className={`${fieldError} mt-2`}>
          The build was not created: {create.error instanceof ApiError && create.error.status === 403 ? 'only engineers can create builds.' : create.error.message}
        </p>
      )}
      <div className="mt-3 flex gap-2">
        <button type="submit" className={btnPrimary} disabled={create.isPending}>
          {create.isPending ? 'Creating…' : 'Create build'}
        </button>
        <button type="button" className={btn} onClick={onCancel} disabled={create.isPending}>
          Cancel
        </button>
      </div>
    </form>
  );
}
