import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { z } from 'zod';
import { ApiError } from '../../../lib/api';
import { useBoards } from '../../../lib/resources/boards';
import { useCoreBuilds } from '../../../lib/resources/builds';
import { useCores } from '../../../lib/resources/cores';
import { useSaveSession, type LimitOutcome, type SavedSession } from '../api/save-session';
import type { BenchController, BenchSnapshot } from '../live/bench-controller';
import { answeredCount } from '../../../../shared/link-engine/sample-pack';
import { LIMIT_MEANINGS } from '../../../../shared/link-engine/limits';
import { btn, btnPrimary, fieldError, input, label, panel, panelTitle } from '../../../components/ui';
import { checkConditionForm, conditionFormFields, ConditionFields, conditionsOfForm, emptyConditionForm } from './condition-fields';

const DEFAULT_CORE_SLUG = 'reference-16';

const saveFormSchema = z.object({
  coreId: z.string().min(1, 'Choose the core this run tested'),
  buildId: z.string(),
  boardId: z.string(),
  notes: z.string().max(10_000, 'Notes are limited to 10,000 characters'),
  tags: z
    .string()
    .refine((v) => splitTags(v).length <= 20, 'At most 20 tags')
    .refine((v) => splitTags(v).every((t) => t.length <= 40), 'Each tag is at most 40 characters'),
  ...conditionFormFields,
}).superRefine(checkConditionForm);
type SaveForm = z.infer<typeof saveFormSchema>;

function splitTags(v: string): string[] {
  return [...new Set(v.split(',').map((t) => t.trim()).filter(Boolean))];
}

/** Plain words for each limit the server checked. */
const LIMIT_NAMES: Record<string, { name: string; unit: string; atMost: boolean }> = LIMIT_MEANINGS;

const num = (v: number) => (Number.isInteger(v) ? v.toLocaleString('en-US') : v.toLocaleString('en-US', { maximumFractionDigits: 4 }));

function outcomeWords(key: string, o: LimitOutcome): string {
  const meta = LIMIT_NAMES[key] ?? { name: key, unit: '', atMost: true };
  const unit = meta.unit ? ` ${meta.unit}` : '';
  const verdict = o.pass === null ? 'NOT CHECKED' : o.pass ? 'PASS' : 'FAIL';
  const measured = o.measured === null ? 'not measured' : `measured ${num(o.measured)}${unit}`;
  return `${verdict} — ${meta.name}: ${measured}, limit ${meta.atMost ? 'at most' : 'at least'} ${num(o.limit)}${unit}`;
}

function errorWords(err: unknown): string {
  if (err instanceof ApiError) {
    if (err.status === 401) return 'Your sign-in has expired. Sign in again, then save.';
    if (err.status === 403) return 'Only engineers can save sessions.';
    if (err.status === 413) return `The upload is too large for the server: ${err.message}`;
    return `The server refused the session: ${err.message}`;
  }
  return `The session could not be saved: ${(err as Error).message}`;
}

function Verdict({ saved }: { saved: SavedSession }) {
  const entries = Object.entries(saved.verdict).filter((e): e is [string, LimitOutcome] => e[1] !== undefined);
  return (
    <div role="status" className="grid gap-2 text-sm" data-testid="save-result">
      <p>
        <span className={`font-bold ${saved.passed ? 'text-pass' : 'text-fail'}`} data-testid="save-verdict">
          {saved.passed ? 'PASS' : 'FAIL'}
        </span>{' '}
        — saved as session <span data-testid="saved-session-id">#{saved.id}</span>.
        {saved.regression && ' This is a regression against the core’s baseline; watchers were told.'}
      </p>
      {entries.length === 0 ? (
        <p className="text-ink-soft">The core has no limits set, so nothing was checked.</p>
      ) : (
        <ul className="grid gap-1" aria-label="Limits">
          {entries.map(([key, o]) => (
            <li key={key} className={o.pass === false ? 'text-fail' : undefined}>
              {outcomeWords(key, o)}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

/** "Save session": offered once a run has ended with results; uploads them for the server to judge. */
export function SaveSessionPanel({ controller, snap }: { controller: BenchController; snap: BenchSnapshot }) {
  const run = snap.run;
  const record = controller.record;
  const [open, setOpen] = useState(false);
  const [saved, setSaved] = useState<SavedSession | null>(null);
  const save = useSaveSession();
  const navigate = useNavigate();
  const cores = useCores();
  const boards = useBoards();
  const { register, handleSubmit, watch, setValue, getValues, reset, formState } = useForm<SaveForm>({
    resolver: zodResolver(saveFormSchema),
    defaultValues: { coreId: '', buildId: '', boardId: '', notes: '', tags: '', ...emptyConditionForm },
  });
  const coreId = watch('coreId');
  // A run is saved to a core of its own mode: the server scores it with that core's model.
  const mode = 'mode' in (record ?? {}) ? 'vectoring' : 'rotation';
  const modeCores = useMemo(() => cores.data?.filter((c) => c.mode === mode), [cores.data, mode]);
  const builds = useCoreBuilds(coreId ? Number(coreId) : null);

  // A new run starts a new save.
  const resetSave = save.reset;
  useEffect(() => {
    setSaved(null);
    setOpen(false);
    resetSave();
  }, [record, resetSave]);

  // Default core: reference-16 for a rotation run when the server has it; the only core of the run's mode otherwise.
  useEffect(() => {
    if (!modeCores) return;
    const current = getValues('coreId');
    if (current && modeCores.some((c) => String(c.id) === current)) return;
    const preferred = (mode === 'rotation' ? modeCores.find((c) => c.slug === DEFAULT_CORE_SLUG) : undefined) ?? (modeCores.length === 1 ? modeCores[0] : undefined);
    const next = preferred ? String(preferred.id) : '';
    if (next !== current) setValue('coreId', next);
  }, [modeCores, mode, getValues, setValue]);

  const ended = run?.state === 'finished';
  const count = record && ended ? answeredCount(record.answered) : 0;
  // A soak's books (a vectoring run has none).
  const soak = record && !('mode' in record) ? record.soak : null;
  if (!ended || !record || count === 0) return null;

  const submit = (v: SaveForm) => {
    setSaved(null);
    save.mutate(
      {
        record,
        coreId: Number(v.coreId),
        buildId: v.buildId ? Number(v.buildId) : null,
        boardId: v.boardId ? Number(v.boardId) : null,
        notes: v.notes.trim(),
        tags: splitTags(v.tags),
        conditions: conditionsOfForm(v),
        link: run.figures ? { ...run.figures } : null,
        archive: record.archive ? new Blob([record.archive.slice()], { type: 'application/octet-stream' }) : null,
      },
      {
        onSuccess: async (s) => {
          setSaved(s);
          setOpen(false);
          reset(v);
          // Saved: the browser's copy is no longer needed; the session's own page shows the verdict.
          await controller.forgetUnsaved();
          await navigate(`/sessions/${s.id}`, { state: { saved: s } });
        },
      },
    );
  };
  const errors = formState.errors;

  return (
    <section aria-labelledby="save-title" className={panel}>
      <h2 id="save-title" className={panelTitle}>
        Session
      </h2>
      {saved && <Verdict saved={saved} />}
      {!open && !saved && (
        <div className="grid gap-2">
          <p className="text-sm text-ink-soft">
            {count.toLocaleString('en-US')} results {soak ? `from the last whole pass of a soak of ${soak.summary.passes.toLocaleString('en-US')} passes, with its timeline and ${soak.unstable.count.toLocaleString('en-US')} unstable codes` : run.result?.status === 'complete' ? 'from a complete run' : 'from an ended run'}
            {run.restoredFrom ? `, restored from this browser (kept ${new Date(run.restoredFrom).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' })})` : ''}. Save them so the server can judge them against the core’s limits; until then this browser keeps them.
          </p>
          <button type="button" className={btnPrimary} onClick={() => setOpen(true)}>
            Save session
          </button>
        </div>
      )}
      {open && (
        <form noValidate onSubmit={handleSubmit(submit)} className="grid gap-2" aria-label="Save session">
          <fieldset disabled={save.isPending} className="grid gap-2">
            <label className={label}>
              Core
              <select className={input} {...register('coreId', { onChange: () => setValue('buildId', '') })}>
                <option value="">{cores.isPending ? 'Loading cores…' : mode === 'vectoring' ? 'Choose a vectoring core' : 'Choose a core'}</option>
                {modeCores?.map((c) => (
                  <option key={c.id} value={c.id}>
                    {c.name} ({c.slug})
                  </option>
                ))}
              </select>
              {errors.coreId && <span className={fieldError}>{errors.coreId.message}</span>}
              {cores.isError && <span className={fieldError}>The cores could not be loaded: {cores.error.message}</span>}
            </label>
            <label className={label}>
              Build (optional)
              <select className={input} {...register('buildId')} disabled={!coreId}>
                <option value="">No build</option>
                {builds.data?.map((b) => (
                  <option key={b.id} value={b.id}>
                    {b.label}
                  </option>
                ))}
              </select>
            </label>
            <label className={label}>
              Board (optional)
              <select className={input} {...register('boardId')}>
                <option value="">No board</option>
                {boards.data?.map((b) => (
                  <option key={b.id} value={b.id}>
                    {b.name}
                  </option>
                ))}
              </select>
            </label>
            <label className={label}>
              Notes
              <textarea className={input} rows={2} {...register('notes')} />
              {errors.notes && <span className={fieldError}>{errors.notes.message}</span>}
            </label>
            <label className={label}>
              Tags (comma-separated)
              <input className={input} {...register('tags')} placeholder="nightly, rev-b" />
              {errors.tags && <span className={fieldError}>{errors.tags.message}</span>}
            </label>
            <ConditionFields register={(k) => register(k)} errors={errors} />
          </fieldset>
          {save.isError && (
            <p role="alert" className={fieldError}>
              {errorWords(save.error)}
            </p>
          )}
          <div className="flex gap-2">
            <button type="submit" className={btnPrimary} disabled={save.isPending}>
              {save.isPending ? 'Saving…' : 'Save'}
            </button>
            <button type="button" className={btn} onClick={() => setOpen(false)} disabled={save.isPending}>
              Cancel
            </button>
          </div>
        </form>
      )}
    </section>
  );
}
