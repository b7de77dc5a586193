// The condition grid (shmoo plot): the sessions of one build or core at their pairs of conditions.
import type { CellVerdict, ConditionGrid, ConditionGridCell, ConditionGridQuery, ConditionGridSession } from '../../shared/contract/condition-grid';
import { conditionValue, type NamedCondition } from '../../shared/soak';
import { BenchSession, Build, Core, SessionConditions } from '../db/models';
import { notFound } from '../http-error';

const verdictOf = (passed: boolean, unstable: number | null): CellVerdict => ((unstable ?? 0) > 0 ? 'unstable' : passed ? 'pass' : 'fail');

export async function conditionGrid(q: ConditionGridQuery): Promise<ConditionGrid> {
  if (q.buildId !== undefined && !(await Build.findByPk(q.buildId, { attributes: ['id'] }))) throw notFound('Build');
  if (q.coreId !== undefined && !(await Core.findByPk(q.coreId, { attributes: ['id'] }))) throw notFound('Core');
  const rows = await BenchSession.findAll({
    where: q.buildId !== undefined ? { buildId: q.buildId } : { coreId: q.coreId! },
    attributes: ['id', 'startedAt', 'passed', 'stats'],
    include: [{ model: SessionConditions, as: 'conditions', attributes: { exclude: ['soak'] } }],
    order: [['startedAt', 'ASC'], ['id', 'ASC']],
  });
  const sessions: ConditionGridSession[] = rows.map((row) => {
    const c = (row.get('conditions') as SessionConditions | null)?.conditions() ?? {};
    const unstable = (row.get('conditions') as SessionConditions | null)?.unstableCodes ?? null;
    const stats = row.stats as { count?: number; overall?: { maxAbsLsb?: number }; mismatches?: { count?: number } };
    return {
      id: row.id,
      x: conditionValue(c, q.x as NamedCondition),
      y: conditionValue(c, q.y as NamedCondition),
      startedAt: row.startedAt.toISOString(),
      passed: row.passed,
      verdict: verdictOf(row.passed, unstable),
      maxAbsErrorLsb: stats.count ? (stats.overall?.maxAbsLsb ?? null) : null,
      mismatches: stats.mismatches?.count ?? null,
      unstableCodes: unstable,
    };
  });
  const cells = new Map<string, ConditionGridCell>();
  for (const s of sessions) {
    if (s.x === null || s.y === null) continue;
    const key = `${s.x}|${s.y}`;
    const cell = cells.get(key) ?? { x: s.x, y: s.y, verdict: 'pass', counts: { pass: 0, fail: 0, unstable: 0 }, sessionIds: [] };
    cell.counts[s.verdict]++;
    cell.sessionIds.push(s.id);
    cell.verdict = cell.counts.unstable > 0 ? 'unstable' : cell.counts.fail > 0 ? 'fail' : 'pass';
    cells.set(key, cell);
  }
  const list = [...cells.values()].sort((a, b) => a.y - b.y || a.x - b.x);
  const unique = (v: number[]) => [...new Set(v)].sort((a, b) => a - b);
  return { x: q.x, y: q.y, xs: unique(list.map((c) => c.x)), ys: unique(list.map((c) => c.y)), cells: list, sessions };
}
