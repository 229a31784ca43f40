import { DEVICE_TYPE_LABELS, EQUIPMENT_DEVICE_TYPES, isLifeSafetyDevice, type DeviceType, type ZoneType } from '@domain/devices';
import type { DeviceLife } from '@domain/device-life';
import { JOB_KIND_LABELS } from '@domain/jobs';
import { DOCUMENT_KIND_LABELS } from '@domain/schemas/document';
import type { Document } from '../models/Document';
import type { Floor } from '../models/Floor';
import type { Job } from '../models/Job';
import type { Zone } from '../models/Zone';

/**
 * What a zone does, in plain words for the household, judged on how it is programmed: "calls
 * for help" only when it reports to the monitoring center. Keyed by zone type.
 */
const WHEN_ARMED: Record<ZoneType, { reported: string; notReported: string }> = {
  entry_exit: {
    reported: 'When the alarm is set, opening it starts the entry countdown so you can switch the alarm off.',
    notReported: 'When the alarm is set, opening it starts the entry countdown so you can switch the alarm off. It does not call the monitoring center.',
  },
  perimeter: {
    reported: 'When the alarm is set, opening it sounds the alarm straight away.',
    notReported: 'When the alarm is set, opening it sounds the alarm straight away. It does not call the monitoring center.',
  },
  interior_follower: {
    reported: 'When the alarm is set, it sounds the alarm unless you came in through the door with the countdown.',
    notReported: 'When the alarm is set, it sounds the alarm unless you came in through the door with the countdown. It does not call the monitoring center.',
  },
  interior_instant: {
    reported: 'When the alarm is set, movement here sounds the alarm straight away.',
    notReported: 'When the alarm is set, movement here sounds the alarm straight away. It does not call the monitoring center.',
  },
  fire_24h: {
    reported: 'Always on, even when the alarm is off: it sounds the fire alarm and the monitoring center is called.',
    notReported: 'Always on, even when the alarm is off: it sounds the fire alarm, but the monitoring center is not called.',
  },
  co_24h: {
    reported: 'Always on, even when the alarm is off: it warns of carbon monoxide and the monitoring center is called.',
    notReported: 'Always on, even when the alarm is off: it warns of carbon monoxide, but the monitoring center is not called.',
  },
  panic_audible: {
    reported: 'Always on: pressing it sounds the alarm and calls for help.',
    notReported: 'Always on: pressing it sounds the alarm. It does not call the monitoring center.',
  },
  panic_silent: {
    reported: 'Always on: pressing it calls for help quietly, without a siren.',
    notReported: 'Always on: pressing it does not sound a siren and does not call the monitoring center. Ask your alarm firm about it.',
  },
  water_24h: {
    reported: 'Always on: it lets you and the monitoring center know about a leak.',
    notReported: 'Always on: it lets you know about a leak. It does not call the monitoring center.',
  },
  temperature_24h: {
    reported: 'Always on: it lets you and the monitoring center know when it gets too hot or too cold.',
    notReported: 'Always on: it lets you know when it gets too hot or too cold. It does not call the monitoring center.',
  },
  monitor_only: {
    reported: 'It chimes or shows on the keypad; it does not set off the alarm.',
    notReported: 'It chimes or shows on the keypad; it does not set off the alarm and does not call the monitoring center.',
  },
};

/** Keyfobs, keypads and sirens are equipment: what each is for, whatever zone it was enrolled on. */
const EQUIPMENT_WORDS: Partial<Record<DeviceType, string>> = {
  keyfob: 'A remote control: it sets and unsets the alarm from your key ring.',
  keypad: 'Where you set and unset the alarm and see what it is doing.',
  siren: 'It sounds when the alarm goes off.',
};

/** The words for a smoke, heat or CO device that is not programmed to protect. */
const NOT_PROTECTING = 'It is not set up to raise the alarm and call for help, so it does not count as protection. Ask your alarm firm to change how it is programmed.';

/** The words for a device the firm has switched off (bypassed). */
const BYPASSED = 'It is switched off at the moment (bypassed), so it does not raise the alarm or call for help. Ask your alarm firm when it will be back in service.';

/** What a device does when the alarm is set, in plain words for the household, as programmed. */
export function whenArmedOf(zone: Pick<Zone, 'deviceType' | 'zoneType' | 'reportsToMonitoring'>, protecting = true, bypassed = false): string {
  const equipment = EQUIPMENT_WORDS[zone.deviceType];
  if (equipment && EQUIPMENT_DEVICE_TYPES.includes(zone.deviceType)) return equipment;
  if (bypassed) return BYPASSED;
  if (isLifeSafetyDevice(zone.deviceType) && !protecting) return NOT_PROTECTING;
  const words = WHEN_ARMED[zone.zoneType];
  if (!words) return 'Ask your alarm firm what this device does.';
  return zone.reportsToMonitoring ? words.reported : words.notReported;
}

/**
 * A device in client terms: no serial, no input, no panel internals. `lifeSafety` marks smoke,
 * heat and CO devices (the page shows the caution beside them); `protects` is false for one whose
 * zone is not programmed to protect.
 */
export function presentPortalDevice(zone: Zone, life: DeviceLife, protecting = true, bypassed = false) {
  return {
    id: zone.id,
    description: zone.description,
    kind: DEVICE_TYPE_LABELS[zone.deviceType] ?? zone.deviceType,
    whenArmed: whenArmedOf(zone, protecting, bypassed),
    chime: Boolean(zone.chime),
    lifeSafety: isLifeSafetyDevice(zone.deviceType),
    protects: !isLifeSafetyDevice(zone.deviceType) || protecting,
    life: { state: life.state, batteryDueOn: life.batteryDueOn, endOfLifeOn: life.endOfLifeOn, endOfLifeBasis: life.endOfLifeBasis },
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
