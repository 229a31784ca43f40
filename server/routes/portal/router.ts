import { Router, type Request, type RequestHandler } from 'express';
import { Op } from 'sequelize';
import { z } from 'zod';
import { deviceLife } from '@domain/device-life';
import { checkLifeSafetyZone } from '@domain/life-safety-zone';
import { contactListSchema } from '@domain/schemas/contact';
import { uuid } from '@domain/schemas/common';
import { serviceRequestSchema } from '@domain/schemas/portal';
import { scoped } from '../../context';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import { inputOf, validate } from '../../middlewares/validate';
import { Document } from '../../models/Document';
import { Floor } from '../../models/Floor';
import { Job } from '../../models/Job';
import { Site } from '../../models/Site';
import { Zone } from '../../models/Zone';
import { portalFileUrl, presentPastVisit, presentPortalDevice, presentPortalDocument, presentPortalPlan, presentUpcomingVisit } from '../../presenters/portal';
import { presentContact } from '../../presenters/contact';
import { presentCoverage } from '../../presenters/premises';
import { listContacts } from '../../services/contacts';
import { coverageForSite } from '../../services/coverage';
import { jobViews } from '../../services/jobs';
import { safeFileName } from '../../services/documents';
import { changeHouseholdContacts, requestService } from '../../services/portal';
import { lifeSafetyInputOf, todayIn, upkeepOf, zoneValuesOf } from '../../services/zones';
import { inTransaction, nowOf, pageOf } from '../helpers';
import { sendStoredFile } from '../send-stored-file';

const siteParams = z.object({ siteId: uuid });
const documentParams = z.object({ siteId: uuid, documentId: uuid });
const floorParams = z.object({ siteId: uuid, floorId: uuid });

/** Only a signed-in client (homeowner) of a firm; staff and the operator get 403. */
const requireClient: RequestHandler = (req, _res, next) => {
  if (!req.user) return next(errors.unauthenticated());
  if (req.user.role !== 'client' || !req.ctx.tenantId) return next(errors.forbidden('The portal is for the firm’s clients.'));
  next();
};

/** The firm contact the portal shows the household (no internal settings). */
function firmContactOf(req: Request) {
  const tenant = req.ctx.tenant;
  return {
    name: tenant?.name ?? '',
    phone: tenant?.phone ?? '',
    monitoringCenterName: tenant?.monitoringCenterName ?? '',
    monitoringCenterPhone: tenant?.monitoringCenterPhone ?? '',
  };
}

/** Client-safe site fields: no passcode, access notes, monitoring account or contract. */
function presentPortalSite(site: Site, req: Request) {
  return {
    id: site.id,
    name: site.name,
    address: {
      line1: site.addressLine1,
      line2: site.addressLine2,
      city: site.city,
      region: site.region,
      postalCode: site.postalCode,
      country: site.country,
    },
    timeZone: site.timeZone,
    firm: firmContactOf(req),
  };
}

/** The household's portal: its own sites only, in client terms. */
export function portalRouter(deps: AppDeps): Router {
  const router = Router();
  router.use('/portal', requireClient);

  /** The client's own site; any other site (same firm or not) is a 404. */
  async function loadOwnSite(req: Request, siteId: string): Promise<Site> {
    const clientId = req.user?.clientId;
    if (!clientId) throw errors.notFound('site');
    const site = await Site.findOne({ where: scoped(req.ctx, { id: siteId, clientId }) });
    if (!site || !req.ability.can('read', 'Site')) throw errors.notFound('site');
    return site;
  }

  /** The site's devices (zones that are not removed) in client terms, with their life. */
  async function devicesOf(req: Request, site: Site) {
    const zones = await Zone.findAll({ where: scoped(req.ctx, { siteId: site.id }), order: [['description', 'ASC'], ['id', 'ASC']] });
    const today = todayIn(site.timeZone, nowOf(deps));
    const upkeep = upkeepOf(req.ctx.tenant);
    const siblings = zones.map(lifeSafetyInputOf);
    return zones
      .filter((zone) => zone.status !== 'removed')
      .map((zone) => {
        const check = checkLifeSafetyZone(lifeSafetyInputOf(zone), siblings);
        return presentPortalDevice(zone, deviceLife(zoneValuesOf(zone), upkeep, today), check.protects.length > 0, zone.status === 'bypassed');
      });
  }

  router.get('/portal/sites', async (req, res) => {
    const clientId = req.user?.clientId;
    const sites = clientId ? await Site.findAll({ where: scoped(req.ctx, { clientId }), order: [['name', 'ASC'], ['id', 'ASC']], limit: 200 }) : [];
    res.json({ data: sites.map((s) => presentPortalSite(s, req)), page: pageOf(1, 200, sites.length) });
  });

  router.get('/portal/sites/:siteId', validate({ params: siteParams }), async (req, res) => {
    const { params } = inputOf(req, { params: siteParams });
    const site = await loadOwnSite(req, params.siteId);
    const now = nowOf(deps);
    // the three reads are independent: run them together
    const [computed, next, devices] = await Promise.all([
      coverageForSite(req.ctx, site.id),
      Job.findOne({
        where: scoped(req.ctx, { siteId: site.id, state: { [Op.in]: ['scheduled'] }, scheduledStart: { [Op.gte]: now } }),
        order: [['scheduledStart', 'ASC']],
        attributes: ['id', 'kind', 'scheduledStart'],
      }),
      devicesOf(req, site),
    ]);
    const coverage = presentCoverage(computed, { audience: 'client' });
    res.json({
      data: {
        site: presentPortalSite(site, req),
        coverage: { openings: coverage.openings, summary: coverage.summary },
        lifeSafety: {
          findings: coverage.findings.filter((f) => f.lifeSafety).map((f) => ({ code: f.code, severity: f.severity, message: f.message })),
          caution: coverage.caution,
        },
        // due, soon, and life-safety devices whose label date must be checked
        devicesDueSoon: devices.filter((d) => d.life.state === 'soon' || d.life.state === 'due' || d.life.state === 'check'),
        nextVisit: next ? { kind: next.kind, scheduledStart: next.scheduledStart?.toISOString() ?? null } : null,
        firm: firmContactOf(req),
      },
    });
  });

  router.get('/portal/sites/:siteId/coverage', validate({ params: siteParams }), async (req, res) => {
    const { params } = inputOf(req, { params: siteParams });
    const site = await loadOwnSite(req, params.siteId);
    const [coverage, floors, zones] = await Promise.all([
      coverageForSite(req.ctx, site.id),
      Floor.findAll({ where: scoped(req.ctx, { siteId: site.id }), attributes: ['id', 'planImageId'] }),
      Zone.findAll({ where: scoped(req.ctx, { siteId: site.id }), attributes: ['id', 'number', 'description', 'deviceType', 'status', 'pinFloorId', 'pinX', 'pinY'] }),
    ]);
    const plans = floors.filter((f) => f.planImageId).map((floor) => presentPortalPlan(site.id, floor, zones));
    res.json({ data: { ...presentCoverage(coverage, { audience: 'client' }), plans } });
  });

  router.get('/portal/sites/:siteId/floors/:floorId/plan', validate({ params: floorParams }), async (req, res) => {
    const { params } = inputOf(req, { params: floorParams });
    const site = await loadOwnSite(req, params.siteId);
    const floor = await Floor.findOne({ where: scoped(req.ctx, { id: params.floorId, siteId: site.id }) });
    if (!floor?.planImageId || !floor.planImageContentType) throw errors.notFound('floor plan');
    await sendStoredFile(res, deps.files, { tenantId: floor.tenantId, fileId: floor.planImageId, contentType: floor.planImageContentType, what: 'floor plan', caching: 'private-hour' });
  });

  /** The documents the firm shared with the household: site documents, job files and completion reports. */
  router.get('/portal/sites/:siteId/documents', validate({ params: siteParams }), async (req, res) => {
    const { params } = inputOf(req, { params: siteParams });
    const site = await loadOwnSite(req, params.siteId);
    const docs = await Document.findAll({
      where: scoped(req.ctx, { siteId: site.id, sharedWithClient: true }),
      order: [['createdAt', 'DESC'], ['id', 'ASC']],
      limit: 500,
    });
    const jobIds = [...new Set(docs.map((d) => d.jobId).filter((id): id is string => Boolean(id)))];
    const jobs = jobIds.length ? await Job.findAll({ where: scoped(req.ctx, { id: { [Op.in]: jobIds } }), attributes: ['id', 'kind', 'completedAt', 'scheduledStart'] }) : [];
    const jobById = new Map(jobs.map((j) => [j.id, j]));
    res.json({ data: docs.map((doc) => presentPortalDocument(doc, doc.jobId ? jobById.get(doc.jobId) : undefined)), page: pageOf(1, 500, docs.length) });
  });

  router.get('/portal/sites/:siteId/documents/:documentId/file', validate({ params: documentParams }), async (req, res) => {
    const { params } = inputOf(req, { params: documentParams });
    const site = await loadOwnSite(req, params.siteId);
    const doc = await Document.findOne({ where: scoped(req.ctx, { id: params.documentId, siteId: site.id, sharedWithClient: true }) });
    if (!doc) throw errors.notFound('document');
    await sendStoredFile(res, deps.files, {
      tenantId: doc.tenantId,
      fileId: doc.fileId,
      contentType: doc.contentType,
      what: 'document file',
      caching: 'no-store',
      downloadName: safeFileName(doc.originalName || doc.title, doc.fileId.split('.').pop() ?? 'bin'),
    });
  });

  router.get('/portal/sites/:siteId/devices', validate({ params: siteParams }), async (req, res) => {
    const { params } = inputOf(req, { params: siteParams });
    const site = await loadOwnSite(req, params.siteId);
    res.json({ data: await devicesOf(req, site) });
  });

  router.get('/portal/sites/:siteId/service', validate({ params: siteParams }), async (req, res) => {
    const { params } = inputOf(req, { params: siteParams });
    const site = await loadOwnSite(req, params.siteId);
    const jobs = await Job.findAll({ where: scoped(req.ctx, { siteId: site.id }), order: [['scheduledStart', 'ASC'], ['createdAt', 'ASC']], limit: 500 });
    const views = await jobViews(req.ctx, jobs);
    const reportFileIds = jobs.map((j) => j.reportFileId).filter((id): id is string => Boolean(id));
    const reportDocs = reportFileIds.length
      ? await Document.findAll({ where: scoped(req.ctx, { siteId: site.id, sharedWithClient: true, fileId: { [Op.in]: reportFileIds } }), attributes: ['id', 'jobId'] })
      : [];
    const reports = new Map(reportDocs.filter((d) => d.jobId).map((d) => [d.jobId!, portalFileUrl(site.id, d.id)]));
    const upcoming = jobs
      .filter((j) => j.state === 'requested' || j.state === 'scheduled' || j.state === 'in_progress')
      .map((j) => presentUpcomingVisit(j, j.technicianId ? (views.userNames.get(j.technicianId) ?? null) : null));
    const past = jobs
      .filter((j) => j.state === 'completed' || j.state === 'cancelled')
      .sort((a, b) => (b.completedAt ?? b.updatedAt).getTime() - (a.completedAt ?? a.updatedAt).getTime())
      .map((j) => presentPastVisit(j, views.files.get(j.id) ?? [], reports.get(j.id) ?? null));
    res.json({ data: { upcoming, past } });
  });

  router.post('/portal/sites/:siteId/service-requests', validate({ params: siteParams, body: serviceRequestSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: siteParams, body: serviceRequestSchema });
    const site = await loadOwnSite(req, params.siteId);
    const job = await inTransaction(req, deps, (ctx) => requestService(ctx, site, body, deps));
    res.status(201).json({ data: { ...presentUpcomingVisit(job, null), clientNotes: job.clientNotes } });
  });

  router.get('/portal/sites/:siteId/contacts', validate({ params: siteParams }), async (req, res) => {
    const { params } = inputOf(req, { params: siteParams });
    const site = await loadOwnSite(req, params.siteId);
    const contacts = await listContacts(req.ctx, site.id);
    res.json({ data: contacts.map(presentContact) });
  });

  router.put('/portal/sites/:siteId/contacts', validate({ params: siteParams, body: contactListSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: siteParams, body: contactListSchema });
    const site = await loadOwnSite(req, params.siteId);
    const contacts = await inTransaction(req, deps, (ctx) => changeHouseholdContacts(ctx, site, body, deps));
    res.json({ data: contacts.map(presentContact) });
  });

  return router;
}
