import { DEVICE_TYPE_LABELS, type ZoneType } from '@domain/devices';
import type { DeviceLife } from '@domain/device-life';
import { JOB_KIND_LABELS } from '@domain/jobs';
import { DOCUMENT_KIND_LABELS } from '@domain/schemas/document';
import type { Document } from '../models/Document';
import type { Floor } from '../models/Floor';
import type { Job } from '../models/Job';
import type { Zone } from '../models/Zone';

const WHEN_ARMED: Record<ZoneType, string> = {
  entry_exit: 'When the alarm is set, opening it starts the entry countdown so you can switch the alarm off.',
  perimeter: 'When the alarm is set, opening it sounds the alarm straight away.',
  interior_follower: 'When the alarm is set, it sounds the alarm unless you came in through the door with the countdown.',
  interior_instant: 'When the alarm is set, movement here sounds the alarm straight away.',
  fire_24h: 'Always on, even when the alarm is off: it sounds the fire alarm and calls for help.',
  co_24h: 'Always on, even when the alarm is off: it warns of carbon monoxide and calls for help.',
  panic_audible: 'Always on: pressing it sounds the alarm and calls for help.',
  panic_silent: 'Always on: pressing it calls for help quietly, without a siren.',
  water_24h: 'Always on: it lets you and the monitoring centre know about a leak.',
  temperature_24h: 'Always on: it lets you and the monitoring centre know when it gets too hot or too cold.',
  monitor_only: 'It only chimes or tells you; it never sounds the alarm.',
};

/** What a zone does when the alarm is set, in plain words for the household. */
export function whenArmedOf(zoneType: ZoneType): string {
  return WHEN_ARMED[zoneType] ?? 'Ask your alarm firm what this device does.';
}

/** A device in client terms: no serial, no input, no panel internals. */
export function presentPortalDevice(zone: Zone, life: DeviceLife) {
  return {
    id: zone.id,
    description: zone.description,
    kind: DEVICE_TYPE_LABELS[zone.deviceType] ?? zone.deviceType,
    whenArmed: whenArmedOf(zone.zoneType),
    chime: Boolean(zone.chime),
    life: { state: life.state, batteryDueOn: life.batteryDueOn, endOfLifeOn: life.endOfLifeOn },
  };
}
export type PresentedPortalDevice = ReturnType<typeof presentPortalDevice>;

/** An upcoming visit: kind, date and the technician's first name only. */
export function presentUpcomingVisit(job: Job, technicianName: string | null) {
  return {
    id: job.id,
    kind: job.kind,
    kindLabel: JOB_KIND_LABELS[job.kind] ?? job.kind,
    state: job.state,
    scheduledStart: job.scheduledStart?.toISOString() ?? null,
    technicianFirstName: technicianName ? (technicianName.trim().split(/\s+/)[0] ?? null) : null,
    summary: job.summary,
    requestedByClient: Boolean(job.requestedByClient),
  };
}

/** Where the household downloads a document the firm shared with it. */
export function portalFileUrl(siteId: string, documentId: string): string {
  return `/api/portal/sites/${siteId}/documents/${documentId}/file`;
}

/** Where the household sees a floor's plan image; `v` changes with the image. */
export function portalPlanUrl(siteId: string, floor: Pick<Floor, 'id' | 'planImageId'>): string {
  return `/api/portal/sites/${siteId}/floors/${floor.id}/plan?v=${encodeURIComponent((floor.planImageId ?? '').slice(0, 8))}`;
}

/** A floor's plan with the devices the firm pinned on it, in client terms (no serials, no inputs). */
export function presentPortalPlan(
  siteId: string,
  floor: Pick<Floor, 'id' | 'planImageId'>,
  zones: readonly Pick<Zone, 'id' | 'number' | 'description' | 'deviceType' | 'status' | 'pinFloorId' | 'pinX' | 'pinY'>[],
) {
  return {
    floorId: floor.id,
    imageUrl: portalPlanUrl(siteId, floor),
    pins: zones
      .filter((z) => z.pinFloorId === floor.id && z.status !== 'removed' && z.pinX !== null && z.pinY !== null)
      .sort((a, b) => a.number - b.number)
      .map((z) => ({ zoneId: z.id, number: z.number, description: z.description, kind: DEVICE_TYPE_LABELS[z.deviceType] ?? z.deviceType, x: z.pinX!, y: z.pinY! })),
  };
}

/** A shared document for the household: what it is, when, and from which visit. */
export function presentPortalDocument(doc: Document, job: Pick<Job, 'kind' | 'completedAt' | 'scheduledStart'> | undefined) {
  return {
    id: doc.id,
    kind: doc.kind,
    kindLabel: DOCUMENT_KIND_LABELS[doc.kind] ?? doc.kind,
    title: doc.title,
    contentType: doc.contentType,
    sizeBytes: doc.sizeBytes,
    createdAt: doc.createdAt.toISOString(),
    visit: job ? { kindLabel: JOB_KIND_LABELS[job.kind] ?? job.kind, on: (job.completedAt ?? job.scheduledStart)?.toISOString() ?? null } : null,
    fileUrl: portalFileUrl(doc.siteId, doc.id),
  };
}

/** A past visit: what the household was told, shared files and the report; never internal notes. */
export function presentPastVisit(job: Job, files: readonly Document[], reportUrl: string | null = null) {
  return {
    id: job.id,
    kind: job.kind,
    kindLabel: JOB_KIND_LABELS[job.kind] ?? job.kind,
    state: job.state,
    completedAt: job.completedAt?.toISOString() ?? null,
    scheduledStart: job.scheduledStart?.toISOString() ?? null,
    summary: job.summary,
    clientNotes: job.clientNotes ?? '',
    files: files
      .filter((doc) => doc.sharedWithClient)
      .map((doc) => ({ id: doc.id, title: doc.title, contentType: doc.contentType, fileUrl: portalFileUrl(doc.siteId, doc.id) })),
    reportUrl: job.state === 'completed' ? reportUrl : null,
  };
}
