/**
 * The invented job history of a demo site: the install (completed, every zone walk-tested
 * and confirmed, a photo shared with the client), sometimes a later service call, and
 * upcoming visits this week for the firm's technicians — some of them today, so the
 * technician's day has something to show. Photos are drawn at seed time.
 */
import type { Transaction } from 'sequelize';
import { DEFAULT_CHECKLISTS, type JobKind } from '@domain/jobs';
import { Document } from '../../models/Document';
import { Job } from '../../models/Job';
import { WalkTest } from '../../models/WalkTest';
import type { Zone } from '../../models/Zone';
import type { TenantFiles } from '../../storage/tenant-files';
import { drawPlan } from './plan-image';

/** A drawn "photo" of a door frame with a contact and magnet fitted: our own invented image. */
function contactPhoto(scale: number): Buffer {
  const s = (n: number) => Math.round(n * scale);
  return drawPlan(
    s(640),
    s(480),
    [
      { x: s(120), y: s(40), w: s(400), h: s(420), fill: [235, 229, 216] }, // door frame
      { x: s(150), y: s(70), w: s(340), h: s(390), fill: [212, 196, 170] }, // door leaf
      { x: s(470), y: s(180), w: s(40), h: s(90), fill: [255, 255, 255] }, // contact on the frame
      { x: s(430), y: s(190), w: s(36), h: s(70), fill: [250, 250, 250] }, // magnet on the door
    ],
    [],
  );
}

function atLocal(day: Date, hour: number): Date {
  // `hour` is a local hour in the firms' time zones (UTC−6 / UTC−7 in winter): demo visits fall in the working day.
  return new Date(Date.UTC(day.getUTCFullYear(), day.getUTCMonth(), day.getUTCDate(), hour + 6, 0, 0));
}

function checklistFor(kind: JobKind, done: boolean) {
  return DEFAULT_CHECKLISTS[kind].map((label) => ({ label, done }));
}

export async function seedJobs(
  site: { id: string; tenantId: string; name: string },
  zones: readonly Zone[],
  options: {
    transaction: Transaction;
    files: TenantFiles;
    today: Date;
    installedOn: string;
    technicianIds: readonly string[];
    siteIndex: number;
    coordinatorId: string | null;
  },
): Promise<void> {
  const { transaction, today, technicianIds, siteIndex } = options;
  const tech = (n: number) => technicianIds[n % technicianIds.length] ?? null;
  const installDay = new Date(`${options.installedOn}T00:00:00Z`);

  // The install, completed and walk-tested.
  const install = await Job.create(
    {
      tenantId: site.tenantId,
      siteId: site.id,
      kind: 'install',
      state: 'completed',
      scheduledStart: atLocal(installDay, 9),
      scheduledEnd: atLocal(installDay, 13),
      technicianId: tech(siteIndex),
      summary: 'New wireless system',
      clientNotes: 'All doors and windows on the ground floor fitted with contacts; smoke and CO alarms upstairs. Arming and disarming shown to the household.',
      internalNotes: 'Panel behind the coat closet door. Spare contacts left in the van.',
      parts: [
        { description: 'Door/window contact', quantity: zones.filter((z) => z.deviceType.endsWith('contact')).length || 1, unitPriceCents: 3900 },
        { description: 'Motion detector', quantity: 1, unitPriceCents: 7900 },
      ],
      checklist: checklistFor('install', true),
      touchedZoneIds: zones.map((z) => z.id),
      startedAt: atLocal(installDay, 9),
      completedAt: atLocal(installDay, 13),
      completedById: tech(siteIndex),
    },
    { transaction },
  );
  for (const zone of zones) {
    await WalkTest.create(
      { tenantId: site.tenantId, jobId: install.id, zoneId: zone.id, result: 'passed', monitoringConfirmed: zone.reportsToMonitoring, note: '', recordedById: tech(siteIndex) },
      { transaction },
    );
  }
  const photoId = await options.files.save(site.tenantId, contactPhoto(1), 'png');
  const thumbId = await options.files.save(site.tenantId, contactPhoto(0.5), 'png');
  await Document.create(
    {
      tenantId: site.tenantId,
      siteId: site.id,
      jobId: install.id,
      kind: 'photo',
      title: 'Front door contact fitted',
      fileId: photoId,
      thumbnailFileId: thumbId,
      contentType: 'image/png',
      sizeBytes: contactPhoto(1).length,
      originalName: 'front-door-contact.png',
      sharedWithClient: true,
      uploadedById: tech(siteIndex),
    },
    { transaction },
  );

  // Every third site: a service call last month that replaced a contact.
  const firstContact = zones.find((z) => z.deviceType === 'door_contact');
  if (siteIndex % 3 === 1 && firstContact) {
    const day = new Date(today.getTime() - (20 + siteIndex) * 86_400_000);
    const call = await Job.create(
      {
        tenantId: site.tenantId,
        siteId: site.id,
        kind: 'service_call',
        state: 'completed',
        scheduledStart: atLocal(day, 10),
        scheduledEnd: atLocal(day, 11),
        technicianId: tech(siteIndex + 1),
        summary: `${firstContact.description} showed trouble`,
        clientNotes: 'Contact realigned and its battery replaced; tested with the monitoring center.',
        parts: [{ description: 'Coin cell CR2032', quantity: 1, unitPriceCents: 450 }],
        checklist: checklistFor('service_call', true),
        touchedZoneIds: [firstContact.id],
        startedAt: atLocal(day, 10),
        completedAt: atLocal(day, 11),
        completedById: tech(siteIndex + 1),
      },
      { transaction },
    );
    await WalkTest.create(
      { tenantId: site.tenantId, jobId: call.id, zoneId: firstContact.id, result: 'passed', monitoringConfirmed: true, note: '', recordedById: tech(siteIndex + 1) },
      { transaction },
    );
  }

  // Upcoming this week: a battery change or an inspection, some today.
  const offset = siteIndex % 5; // today … four days ahead
  const day = new Date(today.getTime() + offset * 86_400_000);
  const kind: JobKind = siteIndex % 2 === 0 ? 'battery_round' : 'inspection';
  const hour = 8 + ((siteIndex * 2) % 8);
  await Job.create(
    {
      tenantId: site.tenantId,
      siteId: site.id,
      kind,
      state: 'scheduled',
      scheduledStart: atLocal(day, hour),
      scheduledEnd: atLocal(day, hour + 1),
      technicianId: tech(siteIndex),
      summary: kind === 'battery_round' ? 'Replace batteries due this quarter' : 'Yearly inspection',
      parts: [],
      checklist: checklistFor(kind, false),
      touchedZoneIds: kind === 'battery_round' ? zones.filter((z) => z.batteryType && z.batteryType !== 'sealed 10-year').slice(0, 3).map((z) => z.id) : [],
    },
    { transaction },
  );

  // One site has a service request from the household, not yet scheduled.
  if (siteIndex === 2) {
    await Job.create(
      {
        tenantId: site.tenantId,
        siteId: site.id,
        kind: 'service_call',
        state: 'requested',
        summary: 'Keypad beeps every few hours',
        clientNotes: 'Any weekday morning works for us.',
        parts: [],
        checklist: checklistFor('service_call', false),
        touchedZoneIds: [],
        requestedByClient: true,
      },
      { transaction },
    );
  }
}
