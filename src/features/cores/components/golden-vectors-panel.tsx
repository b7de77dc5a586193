import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { btn, btnPrimary, fieldError } from '../../../components/ui';
import { useDeleteGoldenVectors } from '../api/delete-golden-vectors';
import { useGoldenVectors, type GoldenVectorSet } from '../api/get-golden-vectors';
import { uploadGoldenVectorsSchema, useUploadGoldenVectors, type UploadGoldenVectorsForm } from '../api/upload-golden-vectors';
import { control, describedBy, FieldShell } from './field-shell';

const pct = (share: number) => `${(share * 100).toLocaleString('en-US', { maximumFractionDigits: share < 0.001 ? 4 : 1 })} %`;

function CoverageBar({ share }: { share: number }) {
  const width = Math.max(0, Math.min(1, share)) * 100;
  return (
    <span className="flex items-center gap-2">
      <span className="font-mono">{pct(share)}</span>
      <span aria-hidden="true" className="inline-block h-2 w-20 overflow-hidden rounded-sm border border-rule bg-paper">
        <span className="block h-full bg-reference" style={{ width: `${width}%` }} />
      </span>
    </span>
  );
}

function SetRow({ set, coreId, canEdit }: { set: GoldenVectorSet; coreId: number; canEdit: boolean }) {
  const remove = useDeleteGoldenVectors(coreId);
  return (
    <tr className="border-b border-rule/60 last:border-0">
      <td className="px-3 py-2 font-bold">{set.name}</td>
      <td className="px-3 py-2 text-right font-mono">{set.count.toLocaleString('en-US')}</td>
      <td className="px-3 py-2 text-right font-mono">{set.distinctCodes.toLocaleString('en-US')}</td>
      <td className="px-3 py-2"><CoverageBar share={set.coverageShare} /></td>
      <td className={`px-3 py-2 text-right font-mono ${set.modelMismatches > 0 ? 'font-bold text-fail' : ''}`}>{set.modelMismatches.toLocaleString('en-US')}</td>
      <td className="px-3 py-2 text-ink-soft">{new Date(set.createdAt).toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric' })}</td>
      {canEdit && (
        <td className="px-3 py-2">
          <button
            type="button"
            className={btn}
            disabled={remove.isPending}
            aria-label={`Delete golden vectors ${set.name}`}
            onClick={() => window.confirm(`Delete the golden-vector set “${set.name}”?`) && remove.mutate(set.id)}
          >
            Delete
          </button>
          {remove.isError && <p role="alert" className={fieldError}>{remove.error.message}</p>}
        </td>
      )}
    </tr>
  );
}

function UploadForm({ coreId }: { coreId: number }) {
  const upload = useUploadGoldenVectors(coreId);
  const { register, handleSubmit, reset, formState } = useForm<UploadGoldenVectorsForm>({ resolver: zodResolver(uploadGoldenVectorsSchema), defaultValues: { name: '' } });
  const e = formState.errors;
  const submit = (v: UploadGoldenVectorsForm) => upload.mutate({ name: v.name.trim(), file: v.files[0] }, { onSuccess: () => reset({ name: '' }) });
  return (
    <form noValidate onSubmit={handleSubmit(submit)} aria-label="Upload golden vectors" className="grid gap-3 sm:grid-cols-[1fr_1fr_auto] sm:items-start">
      <FieldShell id="gv-name" label="Set name" hint="Where the vectors came from, e.g. the RTL simulation run." error={e.name?.message}>
        <input className={control} {...describedBy('gv-name', e.name?.message)} {...register('name')} />
      </FieldShell>
      <FieldShell id="gv-file" label="CSV file" hint="Header angle_code,cos_code,sin_code; one row per vector." error={e.files?.message as string | undefined}>
        <input type="file" accept=".csv,text/csv" className={control} {...describedBy('gv-file', e.files?.message as string | undefined)} {...register('files')} />
      </FieldShell>
      <button type="submit" className={`${btnPrimary} sm:mt-6`} disabled={upload.isPending}>
        {upload.isPending ? 'Uploading…' : 'Upload'}
      </button>
      {upload.isError && (
        <p role="alert" className={`${fieldError} sm:col-span-3`}>
          The set was refused: {upload.error.message.replace(/^(file|name): /, '')}
        </p>
      )}
    </form>
  );
}

/** Golden vectors from RTL simulation: each set checked bit for bit against the core's model. */
export function GoldenVectorsPanel({ coreId, canEdit }: { coreId: number; canEdit: boolean }) {
  const sets = useGoldenVectors(coreId);
  return (
    <div className="grid gap-3">
      {sets.isPending && <p className="text-sm text-ink-soft">Loading golden vectors…</p>}
      {sets.isError && <p role="alert" className={fieldError}>The golden vectors could not be loaded: {sets.error.message}</p>}
      {sets.data?.length === 0 && <p className="text-sm text-ink-soft">No golden vectors for this core.</p>}
      {sets.data && sets.data.length > 0 && (
        <div className="overflow-x-auto">
          <table className="w-full text-sm" aria-label="Golden-vector sets">
            <thead className="border-b border-rule text-left text-xs uppercase tracking-wider text-ink-soft">
              <tr>
                <th scope="col" className="px-3 py-2">Set</th>
                <th scope="col" className="px-3 py-2 text-right">Vectors</th>
                <th scope="col" className="px-3 py-2 text-right">Distinct codes</th>
                <th scope="col" className="px-3 py-2">Coverage</th>
                <th scope="col" className="px-3 py-2 text-right">Model mismatches</th>
                <th scope="col" className="px-3 py-2">Added</th>
                {canEdit && <th scope="col" className="px-3 py-2"><span className="sr-only">Actions</span></th>}
              </tr>
            </thead>
            <tbody>
              {sets.data.map((s) => (
                <SetRow key={s.id} set={s} coreId={coreId} canEdit={canEdit} />
              ))}
            </tbody>
          </table>
        </div>
      )}
      {canEdit && <UploadForm coreId={coreId} />}
    </div>
  );
}
