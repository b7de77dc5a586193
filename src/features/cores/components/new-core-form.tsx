import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { btn, btnPrimary, fieldError, panel, panelTitle } from '../../../components/ui';
import { useCreateCore } from '../api/create-core';
import { CoreFields } from './core-fields';
import { coreFormSchema, formValuesOf, toPayload, type CoreFormValues } from './core-form-schema';
import { IdentityFields } from './identity-fields';
import { placeServerError } from './server-error';

/** An engineer's form for a new core, filled with the default model; opens the core once saved. */
export function NewCoreForm({ onCancel }: { onCancel: () => void }) {
  const create = useCreateCore();
  const navigate = useNavigate();
  const form = useForm<CoreFormValues>({ resolver: zodResolver(coreFormSchema), defaultValues: formValuesOf(null) });
  const [problem, setProblem] = useState<string | null>(null);

  const submit = (values: CoreFormValues) => {
    setProblem(null);
    create.mutate(toPayload(values).payload, {
      onSuccess: (core) => navigate(`/cores/${core.id}`),
      onError: (err) => setProblem(placeServerError(err, form.setError)),
    });
  };

  return (
    <form noValidate onSubmit={form.handleSubmit(submit)} aria-label="New core" className="grid gap-4">
      <fieldset disabled={create.isPending} className="grid gap-4">
        <div className={panel}>
          <h2 className={panelTitle}>New core</h2>
          <IdentityFields form={form} />
        </div>
        <CoreFields form={form} />
      </fieldset>
      <div className="flex flex-wrap items-center gap-3">
        <button type="submit" className={btnPrimary} disabled={create.isPending}>
          {create.isPending ? 'Creating…' : 'Create core'}
        </button>
        <button type="button" className={btn} onClick={onCancel} disabled={create.isPending}>
          Cancel
        </button>
        {problem && (
          <p role="alert" className={fieldError}>
            {problem}
          </p>
        )}
      </div>
    </form>
  );
}
