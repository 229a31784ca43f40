import type { Document } from '../models/Document';
import type { Job } from '../models/Job';
import type { JobViews } from '../services/jobs';
import type { Audience } from './client';
import { presentDocument } from './document';

/** A job's file (photo or document): the document record, the job it belongs to and its thumbnail. */
export function presentJobFile(doc: Document, { audience }: { audience: Audience }) {
  return {
    ...presentDocument(doc, { audience }),
    jobId: doc.jobId ?? null,
    thumbnailUrl: doc.thumbnailFileId ? `/api/documents/${doc.id}/thumbnail` : null,
    ...(audience === 'staff' ? {} : { fileUrl: `/api/documents/${doc.id}/file` }),
  };
}
export type PresentedJobFile = ReturnType<typeof presentJobFile>;

/**
 * A job (api-resources.md, "Job") with what the schedule and the technician's day need:
 * `siteName`, `siteTimeZone` (times are shown in it), `technicianName`, `walkTest` (recorded results, the zones the job touched
 * first), `files`, `overlaps` (other open jobs of the same technician at the same time),
 * `startedAt`, `completedById`, `reportUrl` (the completion report once completed).
 * `internalNotes` are staff only; the client audience also sees only shared files and no
 * overlaps.
 */
export function presentJob(job: Job, views: JobViews, { audience }: { audience: Audience }) {
  const files = (views.files.get(job.id) ?? []).filter((doc) => audience === 'staff' || doc.sharedWithClient);
  const base = {
    id: job.id,
    siteId: job.siteId,
    siteName: views.siteNames.get(job.siteId) ?? '',
    siteTimeZone: views.siteTimeZones.get(job.siteId) ?? 'UTC',
    kind: job.kind,
    state: job.state,
    scheduledStart: job.scheduledStart?.toISOString() ?? null,
    scheduledEnd: job.scheduledEnd?.toISOString() ?? null,
    technicianId: job.technicianId ?? null,
    technicianName: job.technicianId ? (views.userNames.get(job.technicianId) ?? null) : null,
    summary: job.summary,
    clientNotes: job.clientNotes ?? '',
    parts: (job.parts ?? []).map((p) => ({ description: p.description, quantity: p.quantity, unitPriceCents: p.unitPriceCents })),
    checklist: (job.checklist ?? []).map((c) => ({ label: c.label, done: Boolean(c.done) })),
    touchedZoneIds: [...(job.touchedZoneIds ?? [])],
    cancelReason: job.cancelReason ?? '',
    requestedByClient: Boolean(job.requestedByClient),
    startedAt: job.startedAt?.toISOString() ?? null,
    completedAt: job.completedAt?.toISOString() ?? null,
    completedById: job.completedById ?? null,
    reportUrl: job.reportFileId ? `/api/jobs/${job.id}/report.pdf` : null,
    walkTest: (views.walkTests.get(job.id) ?? []).map((w) => ({
      zoneId: w.zoneId,
      panelId: w.panelId,
      zoneNumber: w.zoneNumber,
      zoneDescription: w.zoneDescription,
      touched: w.touched,
      result: w.result,
      monitoringConfirmed: w.monitoringConfirmed,
      note: w.note,
      recordedById: w.recordedById,
      recordedAt: w.recordedAt.toISOString(),
    })),
    files: files.map((doc) => presentJobFile(doc, { audience })),
    createdAt: job.createdAt.toISOString(),
    updatedAt: job.updatedAt.toISOString(),
  };
  if (audience === 'client') return base;
  return { ...base, internalNotes: job.internalNotes ?? '', overlaps: views.overlaps.get(job.id) ?? [] };
}
export type PresentedJob = ReturnType<typeof presentJob>;
