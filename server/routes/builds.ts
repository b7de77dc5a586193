import fs from 'node:fs';
import { Router, type Request } from 'express';
import { z } from 'zod';
import { currentUser, requireRole } from '../auth';
import { Op, type InferAttributes } from 'sequelize';
import { Build, Core, Review, User } from '../db/models';
import { HttpError, notFound } from '../http-error';
import { sendReviewDecisionMail, sendReviewRequestedMail } from '../mail/messages';
import { validate } from '../middleware/validate';
import { recordAudit } from '../services/audit';
import { buildStandings } from '../services/build-status';
import { bitstreamPath, sanitizeFileName, singleBitstream, type HashedFile } from '../uploads/bitstream-storage';
import {
  buildCreateBody,
  buildDetailReply,
  buildFileReply,
  buildListQuery,
  buildListReply,
  buildPatchBody,
  buildReply,
  reviewBody,
  reviewListReply,
  reviewReply,
  reviewRequestReply,
  type BuildRecord,
} from '../../shared/contract/builds';
import type { Sendable } from '../../shared/contract/check';
import { mailSafely, type RouteDeps } from './deps';
import { idParams, originOf, paramsOf, queryOf } from './params';
import { reply } from './reply';


/** What the list and detail include besides the build's own columns (see `coreBrief` and `people`). */
type Included = Sendable<Pick<BuildRecord, 'core' | 'createdBy'>>;
type WithReviewer = Review & { reviewer: User | null };

/** /api/builds: bitstreams of a core, their files and their reviews. */
export function buildsRouter({ db, mailer, config, uploadDir }: RouteDeps) {
  const router = Router();
  const findBuild = async (req: Request) => {
    const build = await Build.findByPk(paramsOf<{ id: number }>(req).id, { include: [{ model: Core, as: 'core' }] });
    if (!build) throw notFound('Build');
    return build as Build & { core: Core };
  };
  const buildLink = (req: Request, build: Build) => `${originOf(req)}/builds/${build.id}`;
  const people = { model: User, as: 'createdBy', attributes: ['id', 'name'] };
  const coreBrief = { model: Core, as: 'core', attributes: ['id', 'name', 'slug'] };
  /** Builds as the API shows them: with their core, author and status (see build-status.ts). */
  const withStanding = async (builds: Build[]) => {
    const standings = await buildStandings(builds.map((b) => b.id));
    return builds.map((b) => ({ ...b.toJSON<InferAttributes<Build> & Included>(), ...standings.get(b.id)! }));
  };
  /** Other builds holding a file with this SHA-256, so the same bitstream is not taken for two. */
  const duplicatesOf = async (build: Build) =>
    build.sha256 ? Build.findAll({ where: { sha256: build.sha256, id: { [Op.ne]: build.id } }, attributes: ['id', 'label'], order: [['id', 'ASC']] }) : [];
  const reviewsOf = (buildId: number) =>
    Review.findAll({ where: { buildId }, include: [{ model: User, as: 'reviewer', attributes: ['id', 'name'] }], order: [['id', 'DESC']] });

  router
    .route('/')
    .get(requireRole('reviewer'), validate({ query: buildListQuery }), async (req, res) => {
      const { coreId } = queryOf<z.infer<typeof buildListQuery>>(req);
      const builds = await Build.findAll({ where: coreId ? { coreId } : {}, include: [coreBrief, people], order: [['id', 'DESC']] });
      reply(res, buildListReply, { builds: await withStanding(builds) });
    })
    .post(requireRole('engineer'), validate({ body: buildCreateBody }), async (req, res) => {
      const me = currentUser(req);
      const body = req.body as z.infer<typeof buildCreateBody>;
      const build = await db.transaction(async (transaction) => {
        if (!(await Core.findByPk(body.coreId, { transaction }))) throw new HttpError(400, 'invalid', 'body.coreId: no such core');
        // No file yet: said outright, so the reply carries the columns a read would.
        const row = await Build.create({ ...body, createdById: me.id, fileName: null, fileSize: null, sha256: null }, { transaction });
        await recordAudit(transaction, me.id, 'create', 'build', row.id, { coreId: row.coreId, label: row.label });
        return row;
      });
      reply(res, buildReply, { build }, 201);
    });

  router
    .route('/:id')
    .get(requireRole('reviewer'), validate({ params: idParams }), async (req, res) => {
      const found = await findBuild(req);
      const build = (await Build.findByPk(found.id, { include: [coreBrief, people] }))!;
      const reviews = await reviewsOf(build.id);
      const [shown] = await withStanding([build]);
      reply(res, buildDetailReply, { build: { ...shown, duplicates: await duplicatesOf(build) }, reviews: reviews as WithReviewer[], standing: reviews[0]?.decision ?? 'unreviewed' });
    })
    .patch(requireRole('engineer'), validate({ params: idParams, body: buildPatchBody }), async (req, res) => {
      const me = currentUser(req);
      const build = await findBuild(req);
      await db.transaction(async (transaction) => {
        await build.update(req.body, { transaction });
        await recordAudit(transaction, me.id, 'update', 'build', build.id, req.body);
      });
      reply(res, buildReply, { build });
    })
    .delete(requireRole('admin'), validate({ params: idParams }), async (req, res) => {
      const me = currentUser(req);
      const build = await findBuild(req);
      await db.transaction(async (transaction) => {
        await build.destroy({ transaction });
        await recordAudit(transaction, me.id, 'delete', 'build', build.id, { label: build.label });
      });
      await fs.promises.rm(bitstreamPath(uploadDir, build.id), { force: true });
      res.status(204).end();
    });

  router
    .route('/:id/file')
    .get(requireRole('reviewer'), validate({ params: idParams }), async (req, res) => {
      const build = await findBuild(req);
      if (!build.fileName) throw notFound('Bitstream file');
      res.download(bitstreamPath(uploadDir, build.id), build.fileName);
    })
    // The build is looked up before multer runs, so nothing is written for an unknown build.
    .post(requireRole('engineer'), validate({ params: idParams }), async (req, _res, next) => {
      await findBuild(req);
      next();
    }, singleBitstream(uploadDir, config.uploadLimitBytes), async (req, res) => {
      const me = currentUser(req);
      const file = req.file as HashedFile | undefined;
      if (!file) throw new HttpError(400, 'invalid', 'file: a multipart field named "file" is required');
      const build = await findBuild(req);
      const fileName = sanitizeFileName(file.originalname);
      try {
        await db.transaction(async (transaction) => {
          await build.update({ fileName, fileSize: file.size, sha256: file.sha256 }, { transaction });
          await recordAudit(transaction, me.id, 'upload', 'build', build.id, { fileName, fileSize: file.size, sha256: file.sha256 });
          // Last, so a failed update keeps the previous file; a rename replaces it atomically.
          await fs.promises.rename(file.path, bitstreamPath(uploadDir, build.id));
        });
      } finally {
        await fs.promises.rm(file.path, { force: true });
      }
      reply(res, buildFileReply, { build, duplicates: await duplicatesOf(build) });
    });

  router
    .route('/:id/reviews')
    .get(requireRole('reviewer'), validate({ params: idParams }), async (req, res) => {
      const build = await findBuild(req);
      reply(res, reviewListReply, { reviews: (await reviewsOf(build.id)) as WithReviewer[] });
    })
    .post(requireRole('reviewer'), validate({ params: idParams, body: reviewBody }), async (req, res) => {
      const me = currentUser(req);
      const build = await findBuild(req);
      const { decision, note } = req.body as z.infer<typeof reviewBody>;
      const review = await db.transaction(async (transaction) => {
        const row = await Review.create({ buildId: build.id, reviewerId: me.id, decision, note }, { transaction });
        await recordAudit(transaction, me.id, decision, 'build', build.id, { reviewId: row.id, note });
        return row;
      });
      const author = build.createdById ? await User.findByPk(build.createdById) : null;
      const mailed =
        !!author &&
        (await mailSafely(() =>
          sendReviewDecisionMail(mailer, author.email, { build: build.label, core: build.core.name, reviewer: me.name, decision, note, link: buildLink(req, build) }),
        ));
      reply(res, reviewReply, { review, mailed }, 201);
    });

  router.route('/:id/request-review').post(requireRole('engineer'), validate({ params: idParams }), async (req, res) => {
    const me = currentUser(req);
    const build = await findBuild(req);
    const reviewers = await User.findAll({ where: { role: 'reviewer', disabled: false } });
    await db.transaction(async (transaction) => {
      await recordAudit(transaction, me.id, 'request_review', 'build', build.id, { reviewers: reviewers.map((r) => r.id) });
    });
    const mailed =
      reviewers.length > 0 &&
      (await mailSafely(() =>
        sendReviewRequestedMail(mailer, reviewers.map((r) => r.email), { build: build.label, core: build.core.name, requestedBy: me.name, link: buildLink(req, build) }),
      ));
    reply(res, reviewRequestReply, { reviewers: reviewers.length, mailed }, 202);
  });

  return router;
}
