import type { UseFormReturn } from 'react-hook-form';
import type { CoreFormValues } from './core-form-schema';
import { control, describedBy, FieldShell } from './field-shell';

/** Name and slug: how people and the runner (--core <slug>) refer to the core. */
export function IdentityFields({ form }: { form: UseFormReturn<CoreFormValues> }) {
  const { register, formState } = form;
  const e = formState.errors;
  return (
    <div className="grid items-start gap-3 sm:grid-cols-2">
      <FieldShell id="core-name" label="Name" hint="How people refer to the core on every page." error={e.name?.message}>
        <input className={control} {...describedBy('core-name', e.name?.message)} {...register('name')} />
      </FieldShell>
      <FieldShell id="core-slug" label="Slug" hint="Short id for the runner and imports: lower-case letters, digits, hyphens." error={e.slug?.message}>
        <input className={`${control} font-mono`} {...describedBy('core-slug', e.slug?.message)} {...register('slug')} />
      </FieldShell>
    </div>
  );
}
