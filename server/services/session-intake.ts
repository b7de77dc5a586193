// Taking in a session, uploaded (samples measured by the bench page or the runner) or imported
// (a recorder archive or CSV): stored and scored in one transaction, then the regression mail,
// then the one reply both give.
import type { Sequelize, Transaction } from 'sequelize';
import type { SessionImportPart, SessionUploadPart } from '../../shared/contract/sessions';
import { SessionEnvelope } from '../db/models';
import type { Mailer } from '../mail/mailer';
import { sanitizeFileName } from '../uploads/bitstream-storage';
import { mailRegression } from './regression-mail';
import { readImport } from './session-import';
import { resolveCore, storeSession, type StoredSession } from './session-ingest';
import { modeOf } from './core-mode';
import type { UploadScoring } from './upload-scoring';

interface IntakeDeps {
  db: Sequelize;
  mailer: Mailer;
  /** Where links point: the regression mail's and the reply's `url` (PUBLIC_URL when set). */
  origin: string;
  operatorId: number;
}

async function accept({ db, mailer, origin }: IntakeDeps, store: (transaction: Transaction) => Promise<StoredSession>) {
  const { row, core, stats, verdict, passed, failedLimits } = await db.transaction(async (transaction) => {
    const stored = await store(transaction);
    // Kept so the compare view reads it instead of scoring the samples again.
    await SessionEnvelope.create({ sessionId: stored.row.id, bounds: stored.envelope }, { transaction });
    return stored;
  });
  if (failedLimits.length > 0) await mailRegression(mailer, origin, row, core, failedLimits);
  return { id: row.id, url: `${origin}/sessions/${row.id}`, passed, regression: row.regression, verdict, stats };
}

/**
 * An upload: the runner's own score fields are dropped, the server scores the samples itself
 * (finishing `scoring`, begun while they arrived, when it is for this core).
 */
export function acceptUpload(deps: IntakeDeps, part: SessionUploadPart, samples: Buffer, archive: Buffer | null, scoring?: UploadScoring) {
  const { link, stats: _s, verdict: _v, passed: _p, sampleCount: _n, ...draft } = part;
  return accept(deps, (transaction) => storeSession(transaction, deps.operatorId, { ...draft, link }, samples, archive, { action: 'upload', scoring }));
}

/** An import: what ran is read from the file; `part` says where it belongs. */
export function acceptImport(deps: IntakeDeps, part: SessionImportPart, file: { buffer: Buffer; originalname: string }) {
  return accept(deps, async (transaction) => {
    // The core's mode says which file formats it takes.
    const imported = readImport(file.buffer, file.originalname, modeOf(await resolveCore(part, transaction)));
    return storeSession(
      transaction,
      deps.operatorId,
      {
        ...part,
        startedAt: part.startedAt ?? new Date(),
        plan: { kind: 'imported', from: imported.source, fileName: sanitizeFileName(file.originalname) },
        transport: { kind: 'import', source: imported.source },
        deviceInfo: imported.deviceInfo,
        link: imported.link,
      },
      imported.samples,
      imported.archive,
      { action: 'import' },
    );
  });
}
