// Scoring a finished run: every answered code in request order, so a replayed archive scores
// to exactly the same figures; tone plans add their spectral figures.
import { ScoreAccumulator, toneFigures, type ModelConfig, type Plan, type ScoreSummary, type ToneFigures } from '../shared/numeric';

export interface RunScore {
  summary: ScoreSummary;
  total: number;
  answered: number;
  missing: number;
  /** Frames dropped for a bad CHECK plus codes never answered. */
  linkErrors: number;
  tone: { cos: ToneFigures; sin: ToneFigures } | null;
  /** The lower SFDR of the two channels, dBc; null unless a tone plan was answered in full. */
  sfdrDb: number | null;
}

/** What scoring needs of a run: codes in request order, answers, and which were answered. */
export interface AnsweredRun {
  codes: ArrayLike<number>;
  cos: ArrayLike<number>;
  sin: ArrayLike<number>;
  answered: ArrayLike<number>;
}

const BATCH = 4096;

export function scoreRun(config: ModelConfig, plan: Plan, run: AnsweredRun, checkFailures: number): RunScore {
  const acc = new ScoreAccumulator(config);
  const n = run.codes.length;
  const codes = new Float64Array(BATCH);
  const cos = new Int32Array(BATCH);
  const sin = new Int32Array(BATCH);
  let answered = 0;
  let k = 0;
  let firstIndex = 0;
  const flush = () => {
    if (k > 0) acc.add(codes.subarray(0, k), cos.subarray(0, k), sin.subarray(0, k), firstIndex);
    k = 0;
  };
  for (let i = 0; i < n; i++) {
    // Batches are runs of consecutive answered indexes, so mismatches keep their request index.
    if (!run.answered[i]) {
      flush();
      continue;
    }
    if (k === 0) firstIndex = i;
    codes[k] = run.codes[i];
    cos[k] = run.cos[i];
    sin[k] = run.sin[i];
    k++;
    answered++;
    if (k === BATCH) flush();
  }
  flush();
  let tone: RunScore['tone'] = null;
  if (plan.kind === 'tone' && answered === n) {
    tone = { cos: toneFigures(Array.from(run.cos).slice(0, n), plan.cycles), sin: toneFigures(Array.from(run.sin).slice(0, n), plan.cycles) };
  }
  return {
    summary: acc.summary(),
    total: n,
    answered,
    missing: n - answered,
    linkErrors: checkFailures + (n - answered),
    tone,
    sfdrDb: tone ? Math.min(tone.cos.sfdrDbc, tone.sin.sfdrDbc) : null,
  };
}
