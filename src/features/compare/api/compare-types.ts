// What GET /api/compare answers (server/routes/compare.ts), as the client reads it.

export interface LimitOutcome {
  limit: number;
  measured: number | null;
  pass: boolean | null;
}

export interface CompareStats {
  count: number | null;
  maxAbsErrorLsb: number | null;
  cosMaxAbsLsb: number | null;
  sinMaxAbsLsb: number | null;
  rmsErrorLsb: number | null;
  cosBiasLsb: number | null;
  sinBiasLsb: number | null;
  magnitudeMaxAbs: number | null;
  phaseMaxAbsRad: number | null;
  modelMismatches: number | null;
  coveragePct: number | null;
}

export interface ComparedSession {
  id: number;
  core: { id: number; name?: string; slug?: string };
  build: { id: number; label: string } | null;
  startedAt: string;
  sampleCount: number;
  passed: boolean;
  regression: boolean;
  verdict: Record<string, LimitOutcome | undefined>;
  stats: CompareStats;
  /** cos and sin counts together; edgesLsb holds each bin's left edge. */
  histogram: { binsPerLsb: number; edgesLsb: number[]; counts: number[]; below: number; above: number } | null;
  /** Lowest and highest signed error (LSB) per bin of the code range, null where empty. */
  errorEnvelope: { degrees: number[]; lo: (number | null)[]; hi: (number | null)[] };
}

export interface DifferingCode {
  code: number;
  degrees: number;
  a: { cos: number; sin: number };
  b: { cos: number; sin: number };
}

/** The first session (`a`) against another (`b`), bit for bit on the codes both answered. */
export interface ComparedPair {
  a: number;
  b: number;
  /** False for a session of another core: its codes mean other angles, so it is not diffed. */
  sameCore: boolean;
  common: number;
  differing: number;
  maxAbsDiffLsb: number;
  firstDiffering: DifferingCode[];
  /** Per bin of the first session's envelope: differing codes and their largest |Δ|. */
  byBin: { differing: number[]; maxAbsDiffLsb: number[] };
}

export interface CompareReply {
  sessions: ComparedSession[];
  pairs: ComparedPair[];
}
