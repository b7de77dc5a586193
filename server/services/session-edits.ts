// Changing and deleting a stored session, each with its audit entry in the same transaction.
import type { Sequelize } from 'sequelize';
import type { SessionPatchBody } from '../../shared/contract/sessions';
import { hasRole } from '../auth';
import { Core, type Role } from '../db/models';
import { HttpError } from '../http-error';
import { recordAudit } from './audit';
import { findSession } from './session-listing';

/** How long an operator may delete a session of their own after uploading it. */
const OWN_DELETE_WINDOW_MS = 24 * 60 * 60 * 1000;

interface Actor {
  id: number;
  role: Role;
}

/** Notes, tags, and making it its core's baseline (only a passing session may be). @throws HttpError 404, 409 */
export async function editSession(db: Sequelize, me: Actor, id: number, body: SessionPatchBody) {
  const session = await findSession(id, { blobs: false });
  if (body.baseline && !session.passed) throw new HttpError(409, 'conflict', 'baseline: only a passing session may be its core’s baseline');
  await db.transaction(async (transaction) => {
    const changes: { notes?: string; tags?: string[] } = {};
    if (body.notes !== undefined) changes.notes = body.notes;
    if (body.tags !== undefined) changes.tags = body.tags;
    if (Object.keys(changes).length) await session.update(changes, { transaction });
    if (body.baseline) await Core.update({ baselineSessionId: session.id }, { where: { id: session.coreId }, transaction });
    await recordAudit(transaction, me.id, 'update', 'session', session.id, { ...body });
  });
  return { session };
}

/** An admin may delete any session; its operator, their own within a day of the upload. @throws HttpError 403, 404 */
export async function deleteSession(db: Sequelize, me: Actor, id: number, now = Date.now()): Promise<void> {
  const session = await findSession(id, { blobs: false });
  const fresh = now - session.createdAt.getTime() < OWN_DELETE_WINDOW_MS;
  if (!hasRole(me.role, 'admin') && !(session.operatorId === me.id && fresh)) {
    throw new HttpError(403, 'forbidden', 'Only an admin, or its operator within 24 hours of the upload, may delete a session');
  }
  await db.transaction(async (transaction) => {
    // No foreign key guards a core's baseline: a deleted baseline leaves the core without one.
    await Core.update({ baselineSessionId: null }, { where: { baselineSessionId: session.id }, transaction });
    await session.destroy({ transaction });
    await recordAudit(transaction, me.id, 'delete', 'session', session.id, { coreId: session.coreId, passed: session.passed, sampleCount: session.sampleCount });
  });
}
