import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { btn, btnPrimary, fieldError, panel } from '../../../components/ui';
import type { CoreRecord } from '../../../lib/resources/cores';
import { useUpdateCore } from '../api/update-core';
import { CoreFields } from './core-fields';
import { coreFormSchema, formValuesOf, toPayload, type CoreFormValues } from './core-form-schema';
import { IdentityFields } from './identity-fields';
import { placeServerError } from './server-error';

/** An engineer's form for a stored core; it keeps what was saved and says so. */
export function CoreEditor({ core }: { core: CoreRecord }) {
  const update = useUpdateCore(core.id);
  const form = useForm<CoreFormValues>({ resolver: zodResolver(coreFormSchema), defaultValues: formValuesOf(core) });
  const [problem, setProblem] = useState<string | null>(null);
  const [savedAt, setSavedAt] = useState<Date | null>(null);
  const dirty = form.formState.isDirty;

  const submit = (values: CoreFormValues) => {
    setProblem(null);
    setSavedAt(null);
    const { payload } = toPayload(values);
    update.mutate(payload, {
      onSuccess: (saved) => {
        form.reset(formValuesOf(saved));
        setSavedAt(new Date());
      },
      onError: (err) => setProblem(placeServerError(err, form.setError)),
    });
  };

  return (
    <form noValidate onSubmit={form.handleSubmit(submit)} aria-label="Core settings" className="grid gap-4">
      <fieldset disabled={update.isPending} className="grid gap-4">
        <div className={panel}>
          <IdentityFields form={form} />
        </div>
        <CoreFields form={form} />
      </fieldset>
      <div className="flex flex-wrap items-center gap-3">
        <button type="submit" className={btnPrimary} disabled={update.isPending || !dirty}>
          {update.isPending ? 'Saving…' : 'Save changes'}
        </button>
        <button type="button" className={btn} disabled={update.isPending || !dirty} onClick={() => { form.reset(formValuesOf(core)); setProblem(null); }}>
          Undo changes
        </button>
        <p role="status" className="text-sm text-ink-soft">
          {savedAt && !dirty ? `Saved at ${savedAt.toLocaleTimeString('en-GB')}. New sessions are judged by these settings.` : dirty ? 'Unsaved changes.' : ''}
        </p>
        {problem && (
          <p role="alert" className={fieldError}>
            {problem}
          </p>
        )}
      </div>
    </form>
  );
}
