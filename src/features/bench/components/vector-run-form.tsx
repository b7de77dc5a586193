import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useCores } from '../../../lib/resources/cores';
import { useForm } from 'react-hook-form';
import type { VectoringFormats } from '../../../../shared/link';
import { bindVectorPlan, inputRange, parseVectorConfig, type VectorConfig } from '../../../../shared/vectoring';
import type { BenchController, BenchSnapshot } from '../live/bench-controller';
import { RunButtons } from './run-buttons';
import { defaultVectorPlanForm, VECTOR_PLAN_KINDS, vectorPlanFieldOf, vectorPlanFormSchema, VectorPlanFieldError, vectorPlanFromForm, type VectorPlanForm } from './vector-plan-from-form';
import { input, label } from '../../../components/ui';
import { CodeField, OptionSelect, ProblemAlert, ProfileEditor, usePlanProblem } from './plan-form-parts';

/** The vectoring profile to score against, prefilled from MODE_INFO; what it does not carry keeps the model's defaults. */
export const vectorProfileFromFormats = (f: VectoringFormats) =>
  JSON.stringify(
    { inBits: f.inBits, inFrac: f.inFrac, iterations: f.iterations, magBits: f.magBits, magFrac: f.magFrac, angleFormat: f.angleFormat, angleBits: f.angleBits, ...(f.angleFormat === 'rad' ? { angleFrac: f.angleFrac } : {}) },
    null,
    1,
  );

/** True when a core's configuration has the formats the board reports (a core it may be). */
const fitsFormats = (c: VectorConfig, f: VectoringFormats) =>
  c.inBits === f.inBits && c.inFrac === f.inFrac && c.iterations === f.iterations && c.magBits === f.magBits && c.magFrac === f.magFrac && c.angleFormat === f.angleFormat && c.angleBits === f.angleBits && (c.angleFormat !== 'rad' || c.angleFrac === f.angleFrac);

/** The plan form of a vectoring core: which (x, y) pairs to ask, and the profile to score them against. */
export function VectorRunForm({ controller, snap, formats }: { controller: BenchController; snap: BenchSnapshot; formats: VectoringFormats }) {
  const [profileText, setProfileText] = useState<string | null>(null);
  // MODE_INFO carries the formats, not the guard bits, rounding or gain compensation: a saved
  // vectoring core with the same formats gives the whole configuration, and is offered first.
  const cores = useCores();
  const vectorCores = (cores.data ?? []).filter((c) => c.mode === 'vectoring' && c.vectorConfig);
  const fitting = vectorCores.filter((c) => fitsFormats(c.vectorConfig!, formats));
  const [source, setSource] = useState<string | null>(null);
  const chosenSource = source ?? (fitting[0] ? String(fitting[0].id) : 'board');
  const sourceCore = vectorCores.find((c) => String(c.id) === chosenSource);
  const profile = profileText ?? (sourceCore ? JSON.stringify(sourceCore.vectorConfig, null, 1) : vectorProfileFromFormats(formats));
  const { problem, setProblem, err, readProfile, planFailed } = usePlanProblem<keyof VectorPlanForm>();
  // A circle of half the full scale by default: well inside the square, clear of the origin.
  const half = Math.floor(inputRange(formats).max / 2);
  const { register, handleSubmit, watch } = useForm<VectorPlanForm>({ resolver: zodResolver(vectorPlanFormSchema), defaultValues: { ...defaultVectorPlanForm, radius: String(half), pairs: `${half} 0\n0 ${half}\n${-half} ${-half}` } });
  const kind = watch('kind');
  const active = snap.run?.state === 'running' || snap.run?.state === 'paused';

  const start = (v: VectorPlanForm) => {
    setProblem(null);
    const config = readProfile(profile, parseVectorConfig);
    if (!config) return;
    if (config.inBits !== formats.inBits) return setProblem({ field: 'profile', message: `Core profile: inBits is ${config.inBits}, but the board takes ${formats.inBits}-bit inputs` });
    try {
      const plan = vectorPlanFromForm(v, config);
      bindVectorPlan(plan, config);
      controller.startVectorRun(plan, config);
    } catch (e) {
      planFailed(e, VectorPlanFieldError, (key) => vectorPlanFieldOf(key, v.kind));
    }
  };
  const { min, max } = inputRange(formats);

  return (
    <form noValidate onSubmit={handleSubmit(start)} className="grid gap-3" aria-label="Vectoring plan">
      <fieldset disabled={snap.status !== 'connected' || active} className="grid grid-cols-2 gap-2">
        <OptionSelect caption="Pairs to ask" options={VECTOR_PLAN_KINDS} reg={register('kind')} />
        <p className="col-span-2 text-xs text-ink-soft">
          x and y are input codes, {min.toLocaleString('en-US')} to {max.toLocaleString('en-US')} ({formats.inBits} bits, {formats.inFrac} of them fraction).
        </p>
        {kind === 'grid' && <CodeField wide caption="Pairs, at most (a square grid)" reg={register('target')} error={err('target')} />}
        {kind === 'circle' && (
          <>
            <CodeField caption="Radius, codes" reg={register('radius')} error={err('radius')} />
            <CodeField caption="Points" reg={register('points')} error={err('points')} />
          </>
        )}
        {kind === 'random' && (
          <>
            <CodeField caption="Count" reg={register('count')} error={err('count')} />
            <CodeField caption="Seed" reg={register('seed')} error={err('seed')} />
          </>
        )}
        {kind === 'list' && <CodeField wide rows={4} caption="Pairs, one per line: x y" reg={register('pairs')} error={err('pairs')} />}
        <label className={`${label} col-span-2`}>
          Score against
          <select
            className={input}
            value={chosenSource}
            onChange={(e) => {
              setSource(e.target.value);
              setProfileText(null);
            }}
          >
            <option value="board">the board’s formats (other keys at their defaults)</option>
            {vectorCores.map((c) => (
              <option key={c.id} value={c.id}>
                core {c.name} ({c.slug}){fitsFormats(c.vectorConfig!, formats) ? '' : ' — other formats than the board’s'}
              </option>
            ))}
          </select>
        </label>
        <ProfileEditor summary="Vectoring profile to score against" name="Vectoring profile (JSON)" rows={6} value={profile} onChange={setProfileText} />
        {err('profile')}
      </fieldset>
      <ProblemAlert problem={problem} />
      <RunButtons controller={controller} snap={snap} />
    </form>
  );
}
