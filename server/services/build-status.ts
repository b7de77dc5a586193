// A build's status, derived from its bench sessions and reviews whenever it is read (nothing is
// stored, so it can never disagree with the rows it comes from). The rules, in order:
//   1. A failing session uploaded at or after the latest review → `failing`: the sign-off (or
//      refusal) was given without it, so a reviewer must look again. A later passing session does
//      not clear this; only a new review does.
//   2. Otherwise a review exists → its decision, `approved` or `rejected`: a reviewer's word
//      outranks session results (passing sessions after an approval keep it approved, and
//      sessions cannot lift a rejection).
//   3. Otherwise no session → `untested`.
//   4. Otherwise the latest session (latest `startedAt`, the higher id on a tie) decides:
//      `passing` or `failing`.
// "Latest review" is the newest by creation (the higher id on a tie); "uploaded after" compares a
// session's createdAt (when the server got it, not when it ran) with the review's createdAt.
import { Op } from 'sequelize';
import { BenchSession, Review } from '../db/models';

export const BUILD_STATUSES = ['untested', 'passing', 'failing', 'approved', 'rejected'] as const;
export type BuildStatus = (typeof BUILD_STATUSES)[number];

export interface SessionFacts {
  id: number;
  passed: boolean;
  startedAt: Date;
  createdAt: Date;
}
export interface ReviewFacts {
  id: number;
  decision: 'approve' | 'reject';
  createdAt: Date;
}

export interface BuildStanding {
  status: BuildStatus;
  sessionCount: number;
  /** When the latest session ran (its startedAt), null without sessions. */
  lastSessionAt: Date | null;
}

type Dated = { id: number };
/** Positive when `a` is later than `b` by `at`, the higher id breaking ties. */
const laterBy = <T extends Dated>(at: (x: T) => Date) => (a: T, b: T) => at(a).getTime() - at(b).getTime() || a.id - b.id;
const laterRun = laterBy<SessionFacts>((s) => s.startedAt);
const laterReview = laterBy<ReviewFacts>((r) => r.createdAt);

/** The status of one build from its sessions and reviews (in any order). */
export function deriveBuildStatus(sessions: SessionFacts[], reviews: ReviewFacts[]): BuildStanding {
  const latestSession = sessions.reduce<SessionFacts | null>((best, s) => (!best || laterRun(s, best) > 0 ? s : best), null);
  const latestReview = reviews.reduce<ReviewFacts | null>((best, r) => (!best || laterReview(r, best) > 0 ? r : best), null);
  const standing = { sessionCount: sessions.length, lastSessionAt: latestSession?.startedAt ?? null };
  if (latestReview) {
    const failedSince = sessions.some((s) => !s.passed && s.createdAt.getTime() >= latestReview.createdAt.getTime());
    if (failedSince) return { ...standing, status: 'failing' };
    return { ...standing, status: latestReview.decision === 'approve' ? 'approved' : 'rejected' };
  }
  if (!latestSession) return { ...standing, status: 'untested' };
  return { ...standing, status: latestSession.passed ? 'passing' : 'failing' };
}

/** The standing of each of `buildIds`, read in two queries (no sample blobs). */
export async function buildStandings(buildIds: number[]): Promise<Map<number, BuildStanding>> {
  const out = new Map<number, BuildStanding>();
  if (buildIds.length === 0) return out;
  const [sessions, reviews] = await Promise.all([
    BenchSession.findAll({ where: { buildId: { [Op.in]: buildIds } }, attributes: ['id', 'buildId', 'passed', 'startedAt', 'createdAt'], raw: true }),
    Review.findAll({ where: { buildId: { [Op.in]: buildIds } }, attributes: ['id', 'buildId', 'decision', 'createdAt'], raw: true }),
  ]);
  const sessionsOf = groupBy(sessions, (s) => s.buildId as number);
  const reviewsOf = groupBy(reviews, (r) => r.buildId);
  for (const id of buildIds) {
    const s = (sessionsOf.get(id) ?? []).map((x) => ({ id: x.id, passed: !!x.passed, startedAt: new Date(x.startedAt), createdAt: new Date(x.createdAt) }));
    const r = (reviewsOf.get(id) ?? []).map((x) => ({ id: x.id, decision: x.decision, createdAt: new Date(x.createdAt) }));
    out.set(id, deriveBuildStatus(s, r));
  }
  return out;
}

function groupBy<T>(rows: T[], key: (row: T) => number): Map<number, T[]> {
  const m = new Map<number, T[]>();
  for (const row of rows) {
    const k = key(row);
    const list = m.get(k);
    if (list) list.push(row);
    else m.set(k, [row]);
  }
  return m;
}
