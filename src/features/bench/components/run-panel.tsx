import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { bindPlan, parseModelConfig } from '../../../../shared/numeric';
import type { BenchController, BenchSnapshot, RunMode } from '../live/bench-controller';
import { ANGLE_UNITS, defaultPlanForm, PLAN_KINDS, planFieldOf, planFormSchema, PlanFieldError, planFromForm, soakFromForm, type PlanForm } from './plan-from-form';
import { input, label, panel, panelTitle } from '../../../components/ui';
import { CodeField, OptionSelect, ProblemAlert, ProfileEditor, usePlanProblem } from './plan-form-parts';
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
  const { problem, setProblem, err, readProfile, planFailed } = usePlanProblem<keyof PlanForm>();
  const { register, handleSubmit, watch } = useForm<PlanForm>({ resolver: zodResolver(planFormSchema), defaultValues: defaultPlanForm });
  const kind = watch('kind');
  const run = snap.run;
  const active = run?.state === 'running' || run?.state === 'paused';
  const connected = snap.status === 'connected';

  const start = (v: PlanForm) => {
    setProblem(null);
    const config = readProfile(profile, parseModelConfig);
    if (!config) return;
    try {
      const plan = planFromForm(v, config);
      bindPlan(plan, config);
      controller.startRun(plan, config, soakFromForm(v.soak));
    } catch (e) {
      planFailed(e, PlanFieldError, planFieldOf);
    }
  };
  const usesUnit = kind === 'one' || kind === 'list' || kind === 'sweep';

  return (
    <form noValidate onSubmit={handleSubmit(start)} className="grid gap-3">
      <fieldset disabled={!connected || active} className="grid grid-cols-2 gap-2">
        <OptionSelect caption="What to ask" options={PLAN_KINDS} reg={register('kind')} />
        {usesUnit && <OptionSelect caption="Angles in" options={ANGLE_UNITS} reg={register('unit')} />}
        {kind === 'one' && <CodeField wide caption="Angle" reg={register('angle')} error={err('angle')} />}
        {kind === 'list' && <CodeField wide rows={3} caption="Angles (commas, spaces or lines between)" reg={register('list')} error={err('list')} />}
        {kind === 'sweep' && (
          <>
            <CodeField caption="Start" reg={register('start')} error={err('start')} />
            <CodeField caption="Step, codes" reg={register('step')} error={err('step')} />
          </>
        )}
        {(kind === 'sweep' || kind === 'random') && <CodeField caption="Count" reg={register('count')} error={err('count')} />}
        {kind === 'random' && <CodeField caption="Seed" reg={register('seed')} error={err('seed')} />}
        {kind === 'tone' && (
          <>
            <CodeField caption="Cycles" reg={register('cycles')} error={err('cycles')} />
            <CodeField caption="Samples (power of 2)" reg={register('samples')} error={err('samples')} />
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
        <ProfileEditor summary="Core profile to score against" name="Core profile (JSON)" rows={5} value={profile} onChange={setProfileText} />
        {err('profile')}
      </fieldset>
      <ProblemAlert problem={problem} />
      <RunButtons controller={controller} snap={snap} />
    </form>
  );
}
