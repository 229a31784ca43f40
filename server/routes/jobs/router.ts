import { Router, type Request, type Response } from 'express';
import { Op, type WhereOptions } from 'sequelize';
import { subject } from '@domain/abilities';
import { JOB_KIND_LABELS } from '@domain/jobs';
import { DOCUMENT_MAX_BYTES } from '@domain/schemas/document';
import { jobCreateSchema, jobListQuery, jobPatchSchema, walkTestSchema } from '@domain/schemas/job';
import { requireTenantId, requireTransaction, scoped, type Ctx } from '../../context';
import type { AppDeps } from '../../deps';
import { assertMailAllowed } from '../../emails/mail-limits';
import { jobCompletionEmail } from '../../emails/templates';
import { errors } from '../../errors';
import { singleUpload } from '../../middlewares/upload';
import { fieldsFromZod, inputOf, validate } from '../../middlewares/validate';
import { Document } from '../../models/Document';
import { Job } from '../../models/Job';
import { Site } from '../../models/Site';
import { presentJob, presentJobFile } from '../../presenters/job';
import { JOB_FILE_TYPES_TEXT, addJobFile, prepareJobFile, removeStored } from '../../services/job-files';
import { produceCompletionReport, type ProducedReport } from '../../services/job-report';
import {
  assertOpen,
  createJob,
  fieldsBeyondTechnician,
  jobListConditions,
  jobViews,
  recordWalkTests,
  transitionJob,
  updateJob,
} from '../../services/jobs';
import { siteHistory } from '../../services/service-history';
import { authorizeRecord, inTransaction, nowOf, pageOf, requireAbility, requireFirm } from '../helpers';
import { sendStoredFile } from '../send-stored-file';
import { documentParams, historyQuery, jobFileFields, jobParams, siteParams, transitionBody } from './schema';

const SORTABLE = { scheduledStart: 'scheduledStart', createdAt: 'createdAt', state: 'state', kind: 'kind' } as const;
const MAX_MB = DOCUMENT_MAX_BYTES / (1024 * 1024);

function orderOf(sort: string | undefined): [string, 'ASC' | 'DESC'] {
  const key = (sort ?? 'scheduledStart').replace(/^-/, '');
  const column = SORTABLE[key as keyof typeof SORTABLE];
  if (!column) throw errors.validation(`sort: use one of ${Object.keys(SORTABLE).join(', ')}.`, { sort: 'Not a sortable field.' });
  return [column, sort?.startsWith('-') ? 'DESC' : 'ASC'];
}

const isTechnician = (req: Request) => req.user?.role === 'technician';

/**
 * Jobs (api-resources.md, "Job"): the list with filters, create, read, change, the
 * state machine's transitions (completion builds and e-mails the report), the walk test, files
 * and photos, the report download, photo thumbnails and a site's service history.
 *
 * Owners and coordinators manage every job; a technician reads every job of the firm and
 * changes only their own — checklist, parts, notes, touched zones, walk tests, files, start and
 * completion. A client reads none here (404; the portal comes later); the operator has no firm.
 */
export function jobsRouter(deps: AppDeps): Router {
  const router = Router();
  /** Reads the multipart body into memory (nothing touches the disk); over the limit → 413, malformed → 400. */
  const readUpload = singleUpload({
    maxBytes: DOCUMENT_MAX_BYTES,
    tooLargeMessage: `A job file may be at most ${MAX_MB} MB. This one is larger, so it was not stored; send a smaller photo or a shorter PDF.`,
    what: 'the file',
    limits: { fields: 10, fieldSize: 4096, parts: 12 },
  });

  /** A job of the firm: 404 unless readable; 403 with a clear message unless the user may change it. */
  async function loadJob(req: Request, jobId: string, action: 'read' | 'update'): Promise<Job> {
    const job = await Job.findOne({ where: scoped(req.ctx, { id: jobId }) });
    if (!job) throw errors.notFound('job');
    const tagged = subject('Job', job.get({ plain: true }));
    if (!req.ability.can('read', tagged)) throw errors.notFound('job');
    if (action === 'update' && !req.ability.can('update', tagged))
      throw errors.forbidden('This job is assigned to another technician: only its technician or the office can change it.');
    return job;
  }

  /** The report goes to the household in the completion's own transaction (the PDF travels in the outbox row). */
  async function queueCompletionMail(ctx: Ctx, job: Job, report: ProducedReport): Promise<void> {
    const transaction = requireTransaction(ctx);
    await assertMailAllowed(transaction, { purpose: 'job_completed', tenantId: job.tenantId, actorId: null, recipients: [report.clientEmail] });
    await deps.outbox.enqueue(transaction, {
      key: `job-completed:${job.id}:${job.reportFileId ?? ''}`,
      purpose: 'job_completed',
      tenantId: job.tenantId,
      actorId: ctx.user?.id ?? null,
      message: jobCompletionEmail({
        to: report.clientEmail,
        firmName: ctx.tenant?.name ?? '',
        siteName: report.siteName,
        jobKindLabel: JOB_KIND_LABELS[job.kind],
        summary: job.summary,
        completedOn: report.completedOn,
        technicianName: report.technicianName,
        report: { filename: report.filename, content: report.pdf },
      }),
    });
  }

  async function present(req: Request, job: Job) {
    const views = await jobViews(req.ctx, [job]);
    return presentJob(job, views, { audience: 'staff' });
  }

  // --- List and create -------------------------------------------------------------------------

  router.get('/jobs', requireFirm, requireAbility('read', 'Job'), validate({ query: jobListQuery }), async (req, res) => {
    const { query } = inputOf(req, { query: jobListQuery });
    const order = orderOf(query.sort);
    if (query.from && query.to && new Date(query.to) <= new Date(query.from)) {
      throw errors.validation('to: The end of the range must come after its start.', { to: 'The end of the range must come after its start.' });
    }
    const conditions: WhereOptions[] = [scoped(req.ctx), ...jobListConditions(query)];
    const { rows, count } = await Job.findAndCountAll({
      where: { [Op.and]: conditions },
      order: [order, ['scheduledStart', 'ASC'], ['createdAt', 'ASC'], ['id', 'ASC']],
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
    });
    const views = await jobViews(req.ctx, rows);
    res.json({ data: rows.map((job) => presentJob(job, views, { audience: 'staff' })), page: pageOf(query.page, query.pageSize, count) });
  });

  router.post('/jobs', requireFirm, validate({ body: jobCreateSchema }), async (req, res) => {
    const { body } = inputOf(req, { body: jobCreateSchema });
    authorizeRecord(req, 'create', 'Job', { tenantId: req.ctx.tenantId, siteId: body.siteId, technicianId: body.technicianId }, 'job');
    const job = await inTransaction(req, deps, (ctx) => createJob(ctx, body));
    res.status(201).json({ data: await present(req, job) });
  });

  // --- One job ---------------------------------------------------------------------------------

  router.get('/jobs/:jobId', requireFirm, validate({ params: jobParams }), async (req, res) => {
    const { params } = inputOf(req, { params: jobParams });
    const job = await loadJob(req, params.jobId, 'read');
    res.json({ data: await present(req, job) });
  });

  router.patch('/jobs/:jobId', requireFirm, validate({ params: jobParams, body: jobPatchSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: jobParams, body: jobPatchSchema });
    const loaded = await loadJob(req, params.jobId, 'update');
    if (isTechnician(req)) {
      const beyond = fieldsBeyondTechnician(body);
      if (beyond.length > 0)
        throw errors.forbidden(
          `A technician changes the checklist, parts, notes and touched zones of their own jobs; ask the office to change ${beyond.join(', ')}.`,
        );
    }
    assertOpen(loaded);
    const job = await inTransaction(req, deps, (ctx) => updateJob(ctx, loaded.id, body));
    res.json({ data: await present(req, job) });
  });

  // --- Transitions (completion builds and sends the report) -------------------------------------

  router.post('/jobs/:jobId/transitions', requireFirm, validate({ params: jobParams, body: transitionBody }), async (req, res) => {
    const { params, body } = inputOf(req, { params: jobParams, body: transitionBody });
    const loaded = await loadJob(req, params.jobId, 'update');
    if (isTechnician(req) && body.to !== 'in_progress' && body.to !== 'completed') {
      throw errors.forbidden('A technician starts and completes their own jobs; ask the office to reschedule, send back or cancel a job.');
    }
    const now = nowOf(deps);
    const stored: string[] = [];
    let job: Job;
    try {
      job = await inTransaction(req, deps, async (ctx) => {
        const tenantId = requireTenantId(ctx);
        if (body.to === 'completed') {
          await assertMailAllowed(ctx.transaction, { purpose: 'job_completed', tenantId, actorId: ctx.user?.id ?? null, recipients: [] });
        }
        const outcome = await transitionJob(ctx, loaded.id, body, now);
        if (body.to !== 'completed') return outcome.job;
        const report = await produceCompletionReport(
          ctx,
          deps.files,
          outcome.job,
          {
            now,
            batteryChanges: outcome.batteryZones.map((z) => ({ zoneNumber: z.number, description: z.description, changedOn: outcome.batteryChangedOn ?? '' })),
          },
          stored,
        );
        if (report.clientEmail) await queueCompletionMail(ctx, outcome.job, report);
        return outcome.job;
      });
    } catch (e) {
      await removeStored(deps.files, loaded.tenantId, stored);
      throw e;
    }
    res.json({ data: await present(req, job) });
  });

  // --- Walk test -------------------------------------------------------------------------------

  router.put('/jobs/:jobId/walk-test', requireFirm, validate({ params: jobParams, body: walkTestSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: jobParams, body: walkTestSchema });
    const loaded = await loadJob(req, params.jobId, 'update');
    assertOpen(loaded);
    const job = await inTransaction(req, deps, (ctx) => recordWalkTests(ctx, loaded.id, body));
    res.json({ data: await present(req, job) });
  });

  // --- Files and photos ------------------------------------------------------------------------

  router.post('/jobs/:jobId/files', requireFirm, validate({ params: jobParams }), async (req: Request, res: Response) => {
    const { params } = inputOf(req, { params: jobParams });
    // authorize before reading the upload
    const job = await loadJob(req, params.jobId, 'update');
    assertOpen(job);
    await readUpload(req, res);

    const parsed = jobFileFields.safeParse(req.body ?? {});
    const file = req.file;
    const fields = parsed.success ? {} : fieldsFromZod(parsed.error);
    if (!file || file.size === 0) fields.file = `Choose ${JOB_FILE_TYPES_TEXT} to upload.`;
    if (!parsed.success || !file || file.size === 0) {
      const first = Object.entries(fields)[0];
      throw errors.validation(first ? `${first[0]}: ${first[1]}` : 'Check the highlighted fields.', fields);
    }
    // recognised, checked and thumbnailed (in a worker thread) before any transaction opens
    const prepared = await prepareJobFile(deps.thumbnails, file.buffer);
    const stored: string[] = [];
    try {
      const doc = await inTransaction(req, deps, (ctx) =>
        addJobFile(
          ctx,
          deps.files,
          job,
          { data: file.buffer, originalName: file.originalname, title: parsed.data.title, sharedWithClient: parsed.data.sharedWithClient },
          prepared,
          stored,
        ),
      );
      res.status(201).json({ data: presentJobFile(doc, { audience: 'staff' }) });
    } catch (e) {
      await removeStored(deps.files, job.tenantId, stored);
      throw e;
    }
  });

  router.get('/documents/:documentId/thumbnail', requireFirm, validate({ params: documentParams }), async (req, res) => {
    const { params } = inputOf(req, { params: documentParams });
    const doc = await Document.findOne({ where: scoped(req.ctx, { id: params.documentId }) });
    if (!doc) throw errors.notFound('document');
    authorizeRecord(req, 'read', 'Document', doc.get({ plain: true }), 'document');
    if (!doc.thumbnailFileId) throw errors.notFound('thumbnail');
    await sendStoredFile(res, deps.files, { tenantId: doc.tenantId, fileId: doc.thumbnailFileId, contentType: 'image/jpeg', what: 'thumbnail', caching: 'no-store' });
  });

  // --- Completion report -----------------------------------------------------------------------

  router.get('/jobs/:jobId/report.pdf', requireFirm, validate({ params: jobParams }), async (req, res) => {
    const { params } = inputOf(req, { params: jobParams });
    const job = await loadJob(req, params.jobId, 'read');
    if (!job.reportFileId) throw errors.notFound('completion report (the job is not completed yet)');
    const doc = await Document.findOne({ where: scoped(req.ctx, { jobId: job.id, fileId: job.reportFileId }) });
    await sendStoredFile(res, deps.files, {
      tenantId: job.tenantId,
      fileId: job.reportFileId,
      contentType: 'application/pdf',
      what: 'completion report',
      caching: 'no-store',
      downloadName: doc?.originalName || 'completion-report.pdf',
    });
  });

  // --- Service history of a site ---------------------------------------------------------------

  router.get('/sites/:siteId/history', requireFirm, validate({ params: siteParams, query: historyQuery }), async (req, res) => {
    const { params, query } = inputOf(req, { params: siteParams, query: historyQuery });
    const site = await Site.findOne({ where: scoped(req.ctx, { id: params.siteId }) });
    if (!site) throw errors.notFound('site');
    authorizeRecord(req, 'read', 'Site', site.get({ plain: true }), 'site');
    // the history is made of jobs: a role that reads the site but no jobs (a client, for now) gets 404
    authorizeRecord(req, 'read', 'Job', { tenantId: site.tenantId, siteId: site.id }, 'site');
    const { entries, total } = await siteHistory(req.ctx, site.id, { type: query.type, page: query.page, pageSize: query.pageSize });
    res.json({
      data: entries.map((e) => ({ type: e.type, at: e.at.toISOString(), title: e.title, detail: e.detail, link: e.link })),
      page: pageOf(query.page, query.pageSize, total),
    });
  });

  return router;
}
