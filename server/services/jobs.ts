/**
 * Jobs (product.md, "Jobs"): create, change, move through the state machine of
 * src/domain/jobs.ts, record walk tests, and gather what a job's JSON needs beyond its row
 * (site and technician names, walk-test rows, files, overlapping jobs of the technician).
 * Every write runs inside the caller's transaction and writes an audit event in it.
 */
import { Op, type WhereOptions } from 'sequelize';
import { type z } from 'zod';
import {
  DEFAULT_CHECKLISTS,
  JOB_KINDS,
  JOB_STATE_LABELS,
  type JobKind,
  type JobState,
  checkTransition,
  isOpenJobState,
} from '@domain/jobs';
import { type jobCreateSchema, type jobPatchSchema, type walkTestSchema } from '@domain/schemas/job';
import { type Ctx, scoped } from '../context';
import { HttpError, errors } from '../errors';
import { Document } from '../models/Document';
import { type ChecklistItem, Job } from '../models/Job';
import { Panel } from '../models/Panel';
import { Site } from '../models/Site';
import type { Tenant } from '../models/Tenant';
import { User } from '../models/User';
import { WalkTest } from '../models/WalkTest';
import { Zone } from '../models/Zone';
import { recordAudit } from './audit-recorder';
import { logZoneChange, todayIn } from './zones';

export type JobCreateValues = z.output<typeof jobCreateSchema>;
export type JobPatchValues = z.output<typeof jobPatchSchema>;
export type WalkTestRows = z.output<typeof walkTestSchema>;

/** The fields a technician may change on their own job; everything else is the office's. */
export const TECHNICIAN_PATCH_FIELDS = ['checklist', 'parts', 'clientNotes', 'internalNotes', 'touchedZoneIds'] as const;

/** A job without an end is shown, and checked for overlaps, as a one-hour visit. */
export const DEFAULT_VISIT_MINUTES = 60;

/** Roles a job may be assigned to. */
const ASSIGNABLE_ROLES = ['technician', 'owner', 'coordinator'];

/** Job kinds that record battery changes on completion. */
export const BATTERY_JOB_KINDS: readonly JobKind[] = ['battery_round', 'service_call'];

const OPEN_STATES: JobState[] = ['requested', 'scheduled', 'in_progress'];

function tx(ctx: Ctx) {
  return ctx.transaction ?? null;
}

/** The checklist a new job of this kind starts from: the firm's template, else our defaults; nothing ticked. */
export function checklistFor(tenant: Pick<Tenant, 'checklistTemplates'> | null, kind: JobKind): ChecklistItem[] {
  const templates = tenant?.checklistTemplates;
  const firm = templates && typeof templates === 'object' ? templates[kind] : undefined;
  const labels = Array.isArray(firm) && firm.every((l) => typeof l === 'string') ? firm : DEFAULT_CHECKLISTS[kind];
  return labels.map((label) => ({ label, done: false }));
}

/** A site of the acting user's firm, or 400 naming `siteId` (the id came in a body). */
export async function siteForJob(ctx: Ctx, siteId: string): Promise<Site> {
  const site = await Site.findOne({ where: scoped(ctx, { id: siteId }), transaction: tx(ctx) });
  if (!site) throw errors.validation('siteId: No such site in this firm.', { siteId: 'No such site in this firm.' });
  return site;
}

/** An active technician, owner or coordinator of the firm, or 400 naming `technicianId`. */
export async function assignableUser(ctx: Ctx, userId: string): Promise<User> {
  const user = await User.findOne({ where: scoped(ctx, { id: userId }), transaction: tx(ctx) });
  const message = 'Choose an active technician, coordinator or owner of this firm.';
  if (!user || user.deactivatedAt || !ASSIGNABLE_ROLES.includes(user.role)) throw errors.validation(`technicianId: ${message}`, { technicianId: message });
  return user;
}

/**
 * Zones of the site's panels, in the order given, or 400 naming `<prefix>.<index>` for the
 * first id that is not one of them (removed zones included: they may still be in a log).
 */
export async function zonesOfSite(ctx: Ctx, siteId: string, zoneIds: readonly string[], prefix: string): Promise<Zone[]> {
  if (zoneIds.length === 0) return [];
  const zones = await Zone.findAll({ where: scoped(ctx, { siteId, id: { [Op.in]: [...new Set(zoneIds)] } }), transaction: tx(ctx) });
  const byId = new Map(zones.map((z) => [z.id, z]));
  const out: Zone[] = [];
  zoneIds.forEach((id, i) => {
    const zone = byId.get(id);
    if (!zone) {
      const key = prefix ? `${prefix}.${i}` : String(i);
      const message = 'Not a zone of a panel at this job’s site.';
      throw errors.validation(`${key}: ${message}`, { [key]: message });
    }
    out.push(zone);
  });
  return out;
}

function unique<T>(values: readonly T[]): T[] {
  return [...new Set(values)];
}

/** Adds a job to a site: `scheduled` when a technician and a start are given, else `requested`. */
export async function createJob(ctx: Ctx, input: JobCreateValues): Promise<Job> {
  const site = await siteForJob(ctx, input.siteId);
  if (input.technicianId) await assignableUser(ctx, input.technicianId);
  const touched = unique(input.touchedZoneIds);
  await zonesOfSite(ctx, site.id, touched, 'touchedZoneIds');
  const job = await Job.create(
    {
      tenantId: site.tenantId,
      siteId: site.id,
      kind: input.kind,
      state: input.technicianId && input.scheduledStart ? 'scheduled' : 'requested',
      scheduledStart: input.scheduledStart ? new Date(input.scheduledStart) : null,
      scheduledEnd: input.scheduledEnd ? new Date(input.scheduledEnd) : null,
      technicianId: input.technicianId,
      summary: input.summary,
      clientNotes: input.clientNotes,
      internalNotes: input.internalNotes,
      parts: input.parts,
      checklist: input.checklist ?? checklistFor(ctx.tenant, input.kind),
      touchedZoneIds: touched,
    },
    { transaction: tx(ctx) },
  );
  await recordAudit(ctx, {
    action: 'job.created',
    subjectType: 'Job',
    subjectId: job.id,
    details: { siteId: site.id, kind: job.kind, state: job.state, technicianId: job.technicianId },
  });
  return job;
}

/** A job re-read inside the caller's transaction; 404 if gone. */
export async function reloadJob(ctx: Ctx, jobId: string): Promise<Job> {
  const job = await Job.findOne({ where: scoped(ctx, { id: jobId }), transaction: tx(ctx) });
  if (!job) throw errors.notFound('job');
  return job;
}

/** 409 for a completed or cancelled job: it is part of the service history now. */
export function assertOpen(job: Pick<Job, 'state'>): void {
  if (!isOpenJobState(job.state))
    throw errors.conflict(`This job is ${JOB_STATE_LABELS[job.state].toLowerCase()}; it can no longer be changed. Create a new job for further work.`);
}

/** The names of fields in a PATCH body a technician may not change (empty when all are theirs). */
export function fieldsBeyondTechnician(patch: Record<string, unknown>): string[] {
  return Object.keys(patch).filter((k) => patch[k] !== undefined && !(TECHNICIAN_PATCH_FIELDS as readonly string[]).includes(k));
}

function sameJson(a: unknown, b: unknown): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}

/**
 * Changes a job (call inside a transaction): only the fields sent. A requested job that now has
 * a technician and a start becomes scheduled; a scheduled or in-progress job must keep both
 * (move it back to requested first). The end must come after the start, whichever was sent.
 */
export async function updateJob(ctx: Ctx, jobId: string, patch: JobPatchValues): Promise<Job> {
  const job = await reloadJob(ctx, jobId);
  assertOpen(job);
  const next = {
    scheduledStart: patch.scheduledStart !== undefined ? (patch.scheduledStart ? new Date(patch.scheduledStart) : null) : job.scheduledStart,
    scheduledEnd: patch.scheduledEnd !== undefined ? (patch.scheduledEnd ? new Date(patch.scheduledEnd) : null) : job.scheduledEnd,
    technicianId: patch.technicianId !== undefined ? patch.technicianId : job.technicianId,
  };
  if (next.scheduledStart && next.scheduledEnd && next.scheduledEnd <= next.scheduledStart) {
    const field = patch.scheduledEnd !== undefined ? 'scheduledEnd' : 'scheduledStart';
    const message = field === 'scheduledEnd' ? 'The end must come after the start.' : 'The start must come before the end.';
    throw errors.validation(`${field}: ${message}`, { [field]: message });
  }
  if (patch.technicianId && patch.technicianId !== job.technicianId) await assignableUser(ctx, patch.technicianId);
  if (job.state !== 'requested') {
    const missing = !next.technicianId ? 'technicianId' : !next.scheduledStart ? 'scheduledStart' : null;
    if (missing) {
      const message = `A ${JOB_STATE_LABELS[job.state].toLowerCase()} job needs a technician and a start. Move it back to requested first.`;
      throw errors.validation(`${missing}: ${message}`, { [missing]: message });
    }
  }
  const touched = patch.touchedZoneIds !== undefined ? unique(patch.touchedZoneIds) : undefined;
  if (touched) await zonesOfSite(ctx, job.siteId, touched, 'touchedZoneIds');

  const values: Partial<Record<string, unknown>> = {
    ...(patch.kind !== undefined ? { kind: patch.kind } : {}),
    ...(patch.summary !== undefined ? { summary: patch.summary } : {}),
    ...(patch.clientNotes !== undefined ? { clientNotes: patch.clientNotes } : {}),
    ...(patch.internalNotes !== undefined ? { internalNotes: patch.internalNotes } : {}),
    ...(patch.parts !== undefined ? { parts: patch.parts } : {}),
    ...(patch.checklist !== undefined ? { checklist: patch.checklist } : {}),
    ...(touched !== undefined ? { touchedZoneIds: touched } : {}),
    ...(patch.scheduledStart !== undefined ? { scheduledStart: next.scheduledStart } : {}),
    ...(patch.scheduledEnd !== undefined ? { scheduledEnd: next.scheduledEnd } : {}),
    ...(patch.technicianId !== undefined ? { technicianId: next.technicianId } : {}),
  };
  const plain = job.get({ plain: true }) as unknown as Record<string, unknown>;
  const changed = Object.keys(values).filter((key) => {
    const before = plain[key];
    const after = values[key];
    if (before instanceof Date || after instanceof Date) return (before as Date | null)?.getTime() !== (after as Date | null)?.getTime();
    return !sameJson(before, after);
  });
  const becomesScheduled = job.state === 'requested' && Boolean(next.technicianId && next.scheduledStart);
  if (changed.length === 0 && !becomesScheduled) return job;
  const from = job.state;
  await job.update({ ...Object.fromEntries(changed.map((k) => [k, values[k]])), ...(becomesScheduled ? { state: 'scheduled' as const } : {}) }, { transaction: tx(ctx) });
  await recordAudit(ctx, {
    action: 'job.updated',
    subjectType: 'Job',
    subjectId: job.id,
    details: { changed, ...(becomesScheduled ? { state: [from, 'scheduled'] } : {}) },
  });
  return job;
}

// ---------------------------------------------------------------------------------------------
// Transitions
// ---------------------------------------------------------------------------------------------

/** Touched zones (still on a panel of the site) without a passed or failed walk-test result. */
export async function touchedZonesWithoutResult(ctx: Ctx, job: Job): Promise<Zone[]> {
  const touched = job.touchedZoneIds ?? [];
  if (touched.length === 0) return [];
  const zones = await Zone.findAll({ where: scoped(ctx, { siteId: job.siteId, id: { [Op.in]: touched } }), transaction: tx(ctx) });
  const tests = await WalkTest.findAll({ where: scoped(ctx, { jobId: job.id, zoneId: { [Op.in]: touched } }), transaction: tx(ctx) });
  // "not tested" is a note, not a result: a touched zone must be tested (a failure with a note is allowed)
  const tested = new Set(tests.filter((t) => t.result !== 'not_tested').map((t) => t.zoneId));
  return zones.filter((z) => !tested.has(z.id)).sort((a, b) => a.number - b.number);
}

export interface TransitionInput {
  to: JobState;
  cancelReason?: string | undefined;
  batteryChangedZoneIds?: string[] | undefined;
}

/** What a transition did beyond the job's row (the route builds the report and sends the mail). */
export interface TransitionOutcome {
  job: Job;
  from: JobState;
  batteryChangedOn: string | null;
  batteryZones: Zone[];
}

/**
 * Moves a job (call inside a transaction), checked by the domain's state machine: an illegal
 * move is a 409 conflict; a missing technician, reason or walk-test result is a 400 naming the
 * field. Entering in progress records the first start; completing records when and by whom,
 * and for battery changes and service calls sets the ticked zones' battery-changed date (the
 * site's today) with a change-log row each.
 */
export async function transitionJob(ctx: Ctx, jobId: string, input: TransitionInput, now: Date): Promise<TransitionOutcome> {
  const job = await reloadJob(ctx, jobId);
  const from = job.state;
  const missing = input.to === 'completed' ? await touchedZonesWithoutResult(ctx, job) : [];
  const check = checkTransition(from, input.to, {
    scheduled: Boolean(job.technicianId && job.scheduledStart),
    touchedZonesWithoutResult: missing.length,
    cancelReason: input.cancelReason,
  });
  if (!check.ok) {
    if (check.field === 'to') throw new HttpError(409, 'conflict', check.message, { to: check.message });
    const detail = check.field === 'walkTest' && missing.length > 0 ? ` Untested: ${missing.map((z) => `zone ${z.number} (${z.description})`).join(', ')}.` : '';
    throw errors.validation(`${check.message}${detail}`, { [check.field]: check.message });
  }

  const batteryIds = unique(input.batteryChangedZoneIds ?? []);
  if (batteryIds.length > 0) {
    let message: string | null = null;
    if (input.to !== 'completed') message = 'Battery changes are recorded when the job is completed.';
    else if (!BATTERY_JOB_KINDS.includes(job.kind)) message = 'Only battery changes and service calls record changed batteries.';
    if (message) throw errors.validation(`batteryChangedZoneIds: ${message}`, { batteryChangedZoneIds: message });
  }
  const batteryZones = await zonesOfSite(ctx, job.siteId, input.batteryChangedZoneIds ?? [], 'batteryChangedZoneIds');

  const values: Partial<Pick<Job, 'state' | 'startedAt' | 'completedAt' | 'completedById' | 'cancelReason'>> = { state: input.to };
  if (input.to === 'in_progress' && !job.startedAt) values.startedAt = now;
  if (input.to === 'cancelled') values.cancelReason = input.cancelReason?.trim() ?? '';
  if (input.to === 'completed') {
    values.completedAt = now;
    values.completedById = ctx.user?.id ?? null;
  }
  await job.update(values, { transaction: tx(ctx) });

  let batteryChangedOn: string | null = null;
  const changedZones: Zone[] = [];
  if (input.to === 'completed' && batteryZones.length > 0) {
    const site = await Site.findOne({ where: scoped(ctx, { id: job.siteId }), transaction: tx(ctx) });
    batteryChangedOn = todayIn(site?.timeZone ?? ctx.tenant?.timeZone, now);
    const panels = await Panel.findAll({ where: scoped(ctx, { id: { [Op.in]: unique(batteryZones.map((z) => z.panelId)) } }), transaction: tx(ctx) });
    const panelById = new Map(panels.map((p) => [p.id, p]));
    for (const zone of unique(batteryZones)) {
      const before = zone.batteryChangedOn ?? null;
      if (before === batteryChangedOn) continue;
      await zone.update({ batteryChangedOn }, { transaction: tx(ctx) });
      const panel = panelById.get(zone.panelId);
      if (panel) {
        await logZoneChange(ctx, panel, {
          zoneId: zone.id,
          zoneNumber: zone.number,
          action: 'updated',
          changes: { batteryChangedOn: [before, batteryChangedOn] },
          marksPanel: false,
        });
      }
      changedZones.push(zone);
    }
  }

  await recordAudit(ctx, {
    action: input.to === 'completed' ? 'job.completed' : input.to === 'cancelled' ? 'job.cancelled' : 'job.transitioned',
    subjectType: 'Job',
    subjectId: job.id,
    details: {
      from,
      to: input.to,
      ...(input.to === 'cancelled' ? { cancelReason: values.cancelReason } : {}),
      ...(changedZones.length > 0 ? { batteryChangedOn, batteryChangedZoneIds: changedZones.map((z) => z.id) } : {}),
    },
  });
  return { job, from, batteryChangedOn, batteryZones: changedZones };
}

// ---------------------------------------------------------------------------------------------
// Walk tests
// ---------------------------------------------------------------------------------------------

/**
 * Records walk-test results (call inside a transaction): one row per zone and job, replaced
 * when the zone is sent again. Each zone must be on a panel of the job's site (400 naming
 * `<index>.zoneId`), listed once; the job must be open.
 */
export async function recordWalkTests(ctx: Ctx, jobId: string, rows: WalkTestRows): Promise<Job> {
  const job = await reloadJob(ctx, jobId);
  assertOpen(job);
  const seen = new Map<string, number>();
  rows.forEach((row, i) => {
    const first = seen.get(row.zoneId);
    if (first !== undefined) {
      const message = `This zone is already listed at ${first}; send each zone once.`;
      throw errors.validation(`${i}.zoneId: ${message}`, { [`${i}.zoneId`]: message });
    }
    seen.set(row.zoneId, i);
  });
  const zones = await Zone.findAll({ where: scoped(ctx, { siteId: job.siteId, id: { [Op.in]: [...seen.keys()] } }), transaction: tx(ctx) });
  const known = new Set(zones.map((z) => z.id));
  rows.forEach((row, i) => {
    if (!known.has(row.zoneId)) {
      const message = 'Not a zone of a panel at this job’s site.';
      throw errors.validation(`${i}.zoneId: ${message}`, { [`${i}.zoneId`]: message });
    }
  });
  const existing = await WalkTest.findAll({ where: scoped(ctx, { jobId: job.id, zoneId: { [Op.in]: [...seen.keys()] } }), transaction: tx(ctx) });
  const byZone = new Map(existing.map((w) => [w.zoneId, w]));
  for (const row of rows) {
    const values = { result: row.result, monitoringConfirmed: row.monitoringConfirmed, note: row.note, recordedById: ctx.user?.id ?? null };
    const saved = byZone.get(row.zoneId);
    if (saved) await saved.update(values, { transaction: tx(ctx) });
    else await WalkTest.create({ tenantId: job.tenantId, jobId: job.id, zoneId: row.zoneId, ...values }, { transaction: tx(ctx) });
  }
  if (rows.length > 0) {
    await recordAudit(ctx, {
      action: 'job.walk_test_recorded',
      subjectType: 'Job',
      subjectId: job.id,
      details: { zones: rows.map((r) => ({ zoneId: r.zoneId, result: r.result, monitoringConfirmed: r.monitoringConfirmed })) },
    });
  }
  return job;
}

// ---------------------------------------------------------------------------------------------
// What a job's JSON needs beyond its row
// ---------------------------------------------------------------------------------------------

export interface WalkTestView {
  zoneId: string;
  panelId: string | null;
  zoneNumber: number | null;
  zoneDescription: string;
  touched: boolean;
  result: WalkTest['result'];
  monitoringConfirmed: boolean;
  note: string;
  recordedById: string | null;
  recordedAt: Date;
}

export interface JobViews {
  siteNames: Map<string, string>;
  siteTimeZones: Map<string, string>;
  userNames: Map<string, string>;
  walkTests: Map<string, WalkTestView[]>;
  files: Map<string, Document[]>;
  overlaps: Map<string, string[]>;
}

/** The end of a job's time range: its end, or a one-hour visit. */
export function rangeEnd(job: Pick<Job, 'scheduledStart' | 'scheduledEnd'>): Date | null {
  if (!job.scheduledStart) return null;
  return job.scheduledEnd ?? new Date(job.scheduledStart.getTime() + DEFAULT_VISIT_MINUTES * 60_000);
}

/**
 * For each open job with a technician and a start: the other open jobs of the same technician
 * whose time ranges overlap (a range is [start, end), a job without an end lasts an hour).
 */
export async function overlapsOf(ctx: Ctx, jobs: readonly Job[]): Promise<Map<string, string[]>> {
  const result = new Map<string, string[]>(jobs.map((j) => [j.id, []]));
  const placed = jobs.filter((j) => isOpenJobState(j.state) && j.technicianId && j.scheduledStart);
  if (placed.length === 0) return result;
  const minStart = new Date(Math.min(...placed.map((j) => j.scheduledStart!.getTime())));
  const maxEnd = new Date(Math.max(...placed.map((j) => rangeEnd(j)!.getTime())));
  const others = await Job.findAll({
    where: {
      [Op.and]: [
        scoped(ctx, {
          technicianId: { [Op.in]: unique(placed.map((j) => j.technicianId!)) },
          state: { [Op.in]: OPEN_STATES },
          scheduledStart: { [Op.lt]: maxEnd },
        }),
        {
          [Op.or]: [
            { scheduledEnd: { [Op.gt]: minStart } },
            { scheduledEnd: null, scheduledStart: { [Op.gt]: new Date(minStart.getTime() - DEFAULT_VISIT_MINUTES * 60_000) } },
          ],
        },
      ],
    },
    order: [
      ['scheduledStart', 'ASC'],
      ['id', 'ASC'],
    ],
    transaction: tx(ctx),
  });
  for (const job of placed) {
    const start = job.scheduledStart!.getTime();
    const end = rangeEnd(job)!.getTime();
    result.set(
      job.id,
      others
        .filter((o) => o.id !== job.id && o.technicianId === job.technicianId && o.scheduledStart!.getTime() < end && rangeEnd(o)!.getTime() > start)
        .map((o) => o.id),
    );
  }
  return result;
}

/** Walk-test rows of these jobs, the zones the job touched first, then by zone number. */
async function walkTestsOf(ctx: Ctx, jobs: readonly Job[]): Promise<Map<string, WalkTestView[]>> {
  const result = new Map<string, WalkTestView[]>(jobs.map((j) => [j.id, []]));
  if (jobs.length === 0) return result;
  const rows = await WalkTest.findAll({ where: scoped(ctx, { jobId: { [Op.in]: jobs.map((j) => j.id) } }), transaction: tx(ctx) });
  if (rows.length === 0) return result;
  const zones = await Zone.findAll({ where: scoped(ctx, { id: { [Op.in]: unique(rows.map((r) => r.zoneId)) } }), transaction: tx(ctx) });
  const zoneById = new Map(zones.map((z) => [z.id, z]));
  const touchedOf = new Map(jobs.map((j) => [j.id, new Set(j.touchedZoneIds ?? [])]));
  for (const row of rows) {
    const zone = zoneById.get(row.zoneId);
    result.get(row.jobId)?.push({
      zoneId: row.zoneId,
      panelId: zone?.panelId ?? null,
      zoneNumber: zone?.number ?? null,
      zoneDescription: zone?.description ?? '',
      touched: touchedOf.get(row.jobId)?.has(row.zoneId) ?? false,
      result: row.result,
      monitoringConfirmed: Boolean(row.monitoringConfirmed),
      note: row.note ?? '',
      recordedById: row.recordedById,
      recordedAt: row.updatedAt,
    });
  }
  for (const list of result.values()) {
    list.sort(
      (a, b) =>
        Number(b.touched) - Number(a.touched) ||
        (a.zoneNumber ?? Number.MAX_SAFE_INTEGER) - (b.zoneNumber ?? Number.MAX_SAFE_INTEGER) ||
        (a.panelId ?? '').localeCompare(b.panelId ?? '') ||
        a.zoneId.localeCompare(b.zoneId),
    );
  }
  return result;
}

/** Everything presenting these jobs needs, in a handful of queries. */
export async function jobViews(ctx: Ctx, jobs: readonly Job[]): Promise<JobViews> {
  const siteIds = unique(jobs.map((j) => j.siteId));
  const userIds = unique(jobs.flatMap((j) => [j.technicianId, j.completedById]).filter((id): id is string => Boolean(id)));
  const [sites, users, walkTests, docs, overlaps] = await Promise.all([
    siteIds.length ? Site.findAll({ where: scoped(ctx, { id: { [Op.in]: siteIds } }), attributes: ['id', 'name', 'timeZone'], transaction: tx(ctx) }) : [],
    userIds.length ? User.findAll({ where: scoped(ctx, { id: { [Op.in]: userIds } }), attributes: ['id', 'name'], transaction: tx(ctx) }) : [],
    walkTestsOf(ctx, jobs),
    jobs.length
      ? Document.findAll({
          where: scoped(ctx, { jobId: { [Op.in]: jobs.map((j) => j.id) } }),
          order: [
            ['createdAt', 'ASC'],
            ['id', 'ASC'],
          ],
          transaction: tx(ctx),
        })
      : [],
    overlapsOf(ctx, jobs),
  ]);
  const reportFiles = new Set(jobs.map((j) => j.reportFileId).filter(Boolean));
  const files = new Map<string, Document[]>(jobs.map((j) => [j.id, []]));
  // the completion report is a document of the job too, but it is offered as the report, not a file
  for (const doc of docs) if (doc.jobId && !reportFiles.has(doc.fileId)) files.get(doc.jobId)?.push(doc);
  return {
    siteNames: new Map(sites.map((s) => [s.id, s.name])),
    siteTimeZones: new Map(sites.map((s) => [s.id, s.timeZone])),
    userNames: new Map(users.map((u) => [u.id, u.name])),
    walkTests,
    files,
    overlaps,
  };
}

/** `where` conditions of the job list's filters. */
export function jobListConditions(query: { state?: JobState | undefined; kind?: JobKind | undefined; technicianId?: string | undefined; siteId?: string | undefined; from?: string | undefined; to?: string | undefined; q?: string | undefined }): WhereOptions[] {
  const conditions: WhereOptions[] = [];
  if (query.state) conditions.push({ state: query.state });
  if (query.kind && (JOB_KINDS as readonly string[]).includes(query.kind)) conditions.push({ kind: query.kind });
  if (query.technicianId) conditions.push({ technicianId: query.technicianId });
  if (query.siteId) conditions.push({ siteId: query.siteId });
  if (query.from) conditions.push({ scheduledStart: { [Op.gte]: new Date(query.from) } });
  if (query.to) conditions.push({ scheduledStart: { [Op.lt]: new Date(query.to) } });
  if (query.q) conditions.push({ summary: { [Op.like]: `%${query.q}%` } });
  return conditions;
}
