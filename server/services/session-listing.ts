// Reading stored sessions as the API shows them: the filtered, paged list and one session's
// detail, both built by `listed` so a list item and a detail are the same shape.
import { literal, Op, type InferAttributes, type WhereOptions } from 'sequelize';
import type { Literal } from 'sequelize/types/utils';
import type { Sendable } from '../../shared/contract/check';
import type { SessionListItem, SessionListQuery } from '../../shared/contract/sessions';
import { jsonArrayContains } from '../db/dialect';
import { BenchSession, Board, Build, Core, SessionConditions, User } from '../db/models';
import { notFound } from '../http-error';
import { conditionRangeWhere, conditionsView } from './session-conditions';

/** Without the blobs, with whether an archive is kept and the names a list shows. */
const LISTED = {
  attributes: { exclude: ['samples', 'archive'], include: [[literal('"BenchSession"."archive" IS NOT NULL'), 'hasArchive']] as [Literal, string][] },
  include: [
    { model: Core, as: 'core', attributes: ['id', 'name', 'slug', 'mode'] },
    { model: Build, as: 'build', attributes: ['id', 'label'] },
    { model: Board, as: 'board', attributes: ['id', 'name'] },
    { model: User, as: 'operator', attributes: ['id', 'name'] },
    { model: SessionConditions, as: 'conditions', attributes: { exclude: ['soak'] } },
  ],
};
/** The detail reads the soak's books as well. */
const DETAILED = { ...LISTED, include: [...LISTED.include.slice(0, -1), { model: SessionConditions, as: 'conditions' }] };
/** The names LISTED includes (not part of the model's own attributes). */
type Included = Sendable<Pick<SessionListItem, 'core' | 'build' | 'board' | 'operator'>>;
const listed = (row: BenchSession, withSoak = false): Sendable<SessionListItem> => ({
  ...row.toJSON<InferAttributes<BenchSession> & Included>(),
  hasArchive: Boolean(row.get('hasArchive')),
  ...conditionsView(row.get('conditions') as SessionConditions | null, { withSoak }),
});

function listWhere(q: SessionListQuery): WhereOptions {
  const where: Record<string | symbol, unknown> = {};
  for (const key of ['coreId', 'buildId', 'boardId', 'operatorId', 'passed', 'regression'] as const) {
    if (q[key] !== undefined) where[key] = q[key];
  }
  if (q.from || q.to) where.startedAt = { ...(q.from ? { [Op.gte]: q.from } : {}), ...(q.to ? { [Op.lte]: q.to } : {}) };
  const and: unknown[] = [];
  if (q.tag) and.push(jsonArrayContains(BenchSession.sequelize!, '"BenchSession"."tags"', q.tag));
  const ranges = conditionRangeWhere(q);
  if (ranges) and.push(ranges);
  if (and.length > 0) where[Op.and] = and;
  return where as WhereOptions;
}

/** One page of sessions matching the filters, newest first unless `sort` says otherwise. */
export async function listSessions(q: SessionListQuery) {
  const column = q.sort.replace('-', '');
  const where = listWhere(q);
  const order: [string, 'ASC' | 'DESC'][] = [[column, q.sort.startsWith('-') ? 'DESC' : 'ASC'], ['id', 'DESC']];
  // The page's ids first, from the sessions table and its indices alone; then those rows with
  // their names. Joining first made a deep page join every row it skipped. The total counts the
  // sessions table alone: the joined names never change how many rows match.
  const [page, count] = await Promise.all([
    BenchSession.findAll({ attributes: ['id'], where, order, limit: q.pageSize, offset: (q.page - 1) * q.pageSize, raw: true }),
    BenchSession.count({ where }),
  ]);
  const rows = page.length ? await BenchSession.findAll({ ...LISTED, where: { id: page.map((r) => r.id) }, order }) : [];
  return { items: rows.map((row) => listed(row)), total: count, page: q.page, pageSize: q.pageSize };
}

/** One session with its names, without the blobs. @throws HttpError 404 */
export async function sessionDetail(id: number) {
  const session = await BenchSession.findByPk(id, DETAILED);
  if (!session) throw notFound('Session');
  return { session: listed(session, true) };
}

/** A stored session with (default) or without its blobs. @throws HttpError 404 */
export async function findSession(id: number, { blobs = true } = {}): Promise<BenchSession> {
  const session = await BenchSession.findByPk(id, blobs ? {} : { attributes: { exclude: ['samples', 'archive'] } });
  if (!session) throw notFound('Session');
  return session;
}
