import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { bindPlan, parseModelConfig, PlanError } from '../../../../shared/numeric';
import type { BenchController, BenchSnapshot, RunMode } from '../live/bench-controller';
import { ANGLE_UNITS, defaultPlanForm, PLAN_KINDS, planFieldOf, planFormSchema, PlanFieldError, planFromForm, soakFromForm, type PlanForm } from './plan-from-form';
import { fieldError, input, label, panel, panelTitle } from '../../../components/ui';
import { RunButtons } from './run-buttons';
import { VectorRunForm } from './vector-run-form';

/** The core profile to score against, prefilled from INFO; the fields INFO does not carry keep the model's defaults. */
const profileFromInfo = (info: NonNullable<BenchSnapshot['info']>) =>
  JSON.stringify({ angleFormat: info.angleFormat, angleBits: info.angleBits, ...(info.angleFormat === 'rad' ? { angleFrac: info.angleFrac } : {}), outBits: info.outBits, outFrac: info.outFrac, iterations: info.iterations }, null, 1);

/**
 * The plan: a rotation plan, or, when the board has a vectoring core (MODE_INFO), a vectoring
 * one; a board serving both lets the operator choose.
 */
export function RunPanel({ controller, snap }: { controller: BenchController; snap: BenchSnapshot }) {
  const vectoring = snap.modes?.vectoring ?? null;
  const both = !!vectoring && snap.modes?.rotation === true;
  const [chosen, setChosen] = useState<RunMode | null>(null);
  const mode: RunMode = vectoring ? (both ? (chosen ?? 'vectoring') : 'vectoring') : 'rotation';
  const busy = snap.run?.state === 'running' || snap.run?.state === 'paused';
  return (
    <section aria-labelledby="run-title" className={panel}>
      <h2 id="run-title" className={panelTitle}>
        Plan
      </h2>
      {both && (
        <fieldset className="mb-3 flex gap-4 text-sm" disabled={busy}>
          <legend className="mb-1 text-ink-soft">The board serves two cores; run the</legend>
          {(['rotation', 'vectoring'] as const).map((m) => (
            <label key={m} className="flex items-center gap-1">
              <input type="radio" name="run-mode" value={m} checked={mode === m} onChange={() => setChosen(m)} />
              {m === 'rotation' ? 'rotating core (cos, sin)' : 'vectoring core (atan2, magnitude)'}
            </label>
          ))}
        </fieldset>
      )}
      {mode === 'vectoring' && vectoring ? (
        <VectorRunForm key={JSON.stringify(vectoring)} controller={controller} snap={snap} formats={vectoring} />
      ) : (
        <RotationRunForm controller={controller} snap={snap} />
      )}
    </section>
  );
}

function RotationRunForm({ controller, snap }: { controller: BenchController; snap: BenchSnapshot }) {
  const info = snap.info;
  const [profileText, setProfileText] = useState<string | null>(null);
  const profile = profileText ?? (info ? profileFromInfo(info) : '');
  const [problem, setProblem] = useState<{ field: keyof PlanForm | 'profile' | null; message: string } | null>(null);
  const { register, handleSubmit, watch } = useForm<PlanForm>({ resolver: zodResolver(planFormSchema), defaultValues: defaultPlanForm });
  const kind = watch('kind');
  const run = snap.run;
  const active = run?.state === 'running' || run?.state === 'paused';
  const connected = snap.status === 'connected';

  const start = (v: PlanForm) => {
    setProblem(null);
    let config;
    try {
      config = parseModelConfig(JSON.parse(profile));
    } catch (e) {
      return setProblem({ field: 'profile', message: `Core profile: ${(e as Error).message}` });
    }
    try {
      const plan = planFromForm(v, config);
      bindPlan(plan, config);
      controller.startRun(plan, config, soakFromForm(v.soak));
    } catch (e) {
      if (e instanceof PlanFieldError) setProblem({ field: e.field, message: e.message });
      else if (e instanceof PlanError) {
        // Shown by the field it is about, without the plan's own key in front.
        const field = planFieldOf(e.key);
        setProblem({ field, message: field ? e.message.slice(e.key.length + 2) : e.message });
      }
      else setProblem({ field: null, message: (e as Error).message });
    }
  };
  const err = (f: keyof PlanForm | 'profile') => problem?.field === f && <span className={fieldError}>{problem.message}</span>;
  const usesUnit = kind === 'one' || kind === 'list' || kind === 'sweep';

  return (
    <form noValidate onSubmit={handleSubmit(start)} className="grid gap-3">
      <fieldset disabled={!connected || active} className="grid grid-cols-2 gap-2">
        <label className={`${label} col-span-2`}>
          What to ask
          <select className={input} {...register('kind')}>
            {PLAN_KINDS.map(([k, text]) => (
              <option key={k} value={k}>
                {text}
              </option>
            ))}
          </select>
        </label>
        {usesUnit && (
          <label className={`${label} col-span-2`}>
            Angles in
            <select className={input} {...register('unit')}>
              {ANGLE_UNITS.map(([u, text]) => (
                <option key={u} value={u}>
                  {text}
                </option>
              ))}
            </select>
          </label>
        )}
        {kind === 'one' && (
          <label className={`${label} col-span-2`}>
            Angle
            <input className={`${input} font-mono`} {...register('angle')} />
            {err('angle')}
          </label>
        )}
        {kind === 'list' && (
          <label className={`${label} col-span-2`}>
            Angles (commas, spaces or lines between)
            <textarea rows={3} className={`${input} font-mono`} {...register('list')} />
            {err('list')}
          </label>
        )}
        {kind === 'sweep' && (
          <>
            <label className={label}>
              Start
              <input className={`${input} font-mono`} {...register('start')} />
              {err('start')}
            </label>
            <label className={label}>
              Step, codes
              <input className={`${input} font-mono`} {...register('step')} />
              {err('step')}
            </label>
          </>
        )}
        {(kind === 'sweep' || kind === 'random') && (
          <label className={label}>
            Count
            <input className={`${input} font-mono`} {...register('count')} />
            {err('count')}
          </label>
        )}
        {kind === 'random' && (
          <label className={label}>
            Seed
            <input className={`${input} font-mono`} {...register('seed')} />
            {err('seed')}
          </label>
        )}
        {kind === 'tone' && (
          <>
            <label className={label}>
              Cycles
              <input className={`${input} font-mono`} {...register('cycles')} />
              {err('cycles')}
            </label>
            <label className={label}>
              Samples (power of 2)
              <input className={`${input} font-mono`} {...register('samples')} />
              {err('samples')}
            </label>
          </>
        )}
        <label className={`${label} col-span-2`}>
          Repeat (soak)
          <input className={`${input} font-mono`} placeholder="blank: once" aria-describedby="soak-hint" {...register('soak')} />
          <span id="soak-hint" className="text-xs text-ink-soft">
            Passes (50) or a duration (90s, 30m, 2h). Codes whose answers differ between passes are listed as unstable.
          </span>
          {err('soak')}
        </label>
        <details className="col-span-2 text-sm">
          <summary className="cursor-pointer text-ink-soft">Core profile to score against</summary>
          <textarea aria-label="Core profile (JSON)" rows={5} className={`${input} mt-1 font-mono text-xs`} value={profile} onChange={(e) => setProfileText(e.target.value)} />
        </details>
        {err('profile')}
      </fieldset>
      {problem && problem.field === null && (
        <p role="alert" className="text-sm text-fail">
          {problem.message}
        </p>
      )}
      <RunButtons controller={controller} snap={snap} />
    </form>
  );
}
