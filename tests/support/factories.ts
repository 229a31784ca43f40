/**
 * Factories that respect tenants: each builds its own firm unless given one, so tests
 * never share data and can run in parallel.
 */
import crypto from 'node:crypto';
import type { StaffRole } from '@domain/roles';
import type { TenantState } from '@domain/tenant-states';
import { trialEndsAt } from '@domain/tenant-states';
import { hashPassword } from '@server/auth/passwords';
import { Client } from '@server/models/Client';
import { EmergencyContact } from '@server/models/EmergencyContact';
import { Site } from '@server/models/Site';
import { Tenant } from '@server/models/Tenant';
import { User } from '@server/models/User';
import { Panel } from '@server/models/Panel';
import { Zone } from '@server/models/Zone';
import { CP01_DEFAULTS, type PanelSettings } from '@domain/cp01';
import { zoneDefaultsFor } from '@domain/zones';
import type { CommPath, DeviceType, ZoneStatus, ZoneType } from '@domain/devices';
import type { PanelOccupancy } from '@domain/panel-power';
import type { OpeningKind, RoomKind } from '@domain/premises';
import { Floor } from '@server/models/Floor';
import { Opening } from '@server/models/Opening';
import { Room } from '@server/models/Room';
import type { JobKind, JobState } from '@domain/jobs';
import { Job, type ChecklistItem, type JobPart } from '@server/models/Job';

export const TEST_PASSWORD = 'correct horse battery';
let passwordHash: Promise<string> | undefined;
const hashed = () => (passwordHash ??= hashPassword(TEST_PASSWORD));

const unique = () => crypto.randomUUID().slice(0, 8);

/**
 * A firm on trial. Its trial ends far in the future unless the test says otherwise, so a test
 * that moves its clock ahead does not also make the firm read-only (billing tests set it).
 */
export async function buildFirm(overrides: Partial<{ name: string; state: TenantState; trialEndsAt: Date | null; planKey: string | null }> = {}): Promise<Tenant> {
  const id = unique();
  return Tenant.create({
    name: overrides.name ?? `Test Firm ${id}`,
    shortName: `test-firm-${id}`,
    state: overrides.state ?? 'trialing',
    trialEndsAt: overrides.trialEndsAt !== undefined ? overrides.trialEndsAt : trialEndsAt(new Date('2100-01-01T00:00:00Z')),
    planKey: overrides.planKey ?? null,
  });
}

export async function buildUser(
  tenant: Tenant | null,
  role: StaffRole | 'client' | 'operator',
  overrides: Partial<{ email: string; name: string; deactivatedAt: Date | null }> = {},
): Promise<User> {
  const id = unique();
  const user = await User.create({
    tenantId: tenant?.id ?? null,
    email: overrides.email ?? `${role}-${id}@test.example`,
    name: overrides.name ?? `Test ${role} ${id}`,
    role,
    passwordHash: await hashed(),
    deactivatedAt: overrides.deactivatedAt ?? null,
  });
  user.tenant = tenant;
  return user;
}

/** A firm with one person of each staff role. */
export async function buildFirmWithStaff(overrides: Partial<{ state: TenantState }> = {}) {
  const firm = await buildFirm(overrides);
  const [owner, coordinator, technician] = await Promise.all([
    buildUser(firm, 'owner'),
    buildUser(firm, 'coordinator'),
    buildUser(firm, 'technician'),
  ]);
  return { firm, owner: owner, coordinator: coordinator, technician: technician };
}

// ---- The installed base: clients, sites, emergency contacts ----

/** A client record of this firm (invented household, .example e-mail). */
export async function buildClient(
  tenant: Tenant,
  overrides: Partial<{ name: string; email: string; phone: string; notes: string; status: 'active' | 'cancelled' }> = {},
): Promise<Client> {
  const id = unique();
  return Client.create({
    tenantId: tenant.id,
    name: overrides.name ?? `Household ${id}`,
    email: overrides.email ?? `household-${id}@clients.example`,
    phone: overrides.phone ?? '+15550104400',
    notes: overrides.notes ?? 'Gate code is with the office.',
    status: overrides.status ?? 'active',
  });
}

/** A homeowner sign-in (role `client`) linked to this client record. */
export async function buildClientUser(tenant: Tenant, client: Client): Promise<User> {
  const user = await buildUser(tenant, 'client');
  user.clientId = client.id;
  await user.save();
  return user;
}

/** A site of this client, with an invented address; `passcodeCipher` only when given. */
export async function buildSite(
  tenant: Tenant,
  client: Client,
  overrides: Partial<{ name: string; city: string; addressLine1: string; monitoringAccount: string; accessNotes: string; passcodeCipher: string | null }> = {},
): Promise<Site> {
  const id = unique();
  return Site.create({
    tenantId: tenant.id,
    clientId: client.id,
    name: overrides.name ?? `Home ${id}`,
    addressLine1: overrides.addressLine1 ?? '14 Quarry Lane',
    city: overrides.city ?? 'Ashby Vale',
    region: 'NE',
    postalCode: '68001',
    timeZone: 'America/Chicago',
    monitoringAccount: overrides.monitoringAccount ?? `MA-${id.slice(0, 6).toUpperCase()}`,
    accessNotes: overrides.accessNotes ?? 'Key safe behind the shed.',
    passcodeCipher: overrides.passcodeCipher ?? null,
  });
}

/** An emergency contact of this site at `position` (the caller keeps positions 1..n). */
export async function buildContact(site: Site, position: number, overrides: Partial<{ name: string; phone: string }> = {}): Promise<EmergencyContact> {
  return EmergencyContact.create({
    tenantId: site.tenantId,
    siteId: site.id,
    position,
    name: overrides.name ?? `Contact ${position}`,
    relation: 'Neighbour',
    phone: overrides.phone ?? `+1555010${String(4400 + position)}`,
  });
}

/** A firm with its three staff, one client record with a site, and that client's sign-in. */
export async function buildFirmWithSite() {
  const staff = await buildFirmWithStaff();
  const client = await buildClient(staff.firm);
  const site = await buildSite(staff.firm, client);
  const clientUser = await buildClientUser(staff.firm, client);
  return { ...staff, client, site, clientUser };
}

// ---- Panels and zones ----

/** A panel at this site: 64 zones, wireless 9–64, cellular, CP-01 default settings unless given. */
export async function buildPanel(
  site: Site,
  overrides: Partial<{
    label: string;
    makeModel: string;
    zoneCapacity: number;
    wirelessZoneFrom: number;
    wirelessZoneTo: number;
    settings: Partial<PanelSettings>;
    changedSinceProgrammed: boolean;
    commPath: CommPath;
    occupancy: PanelOccupancy;
    standbyCurrentMa: number | null;
    alarmCurrentMa: number | null;
    batteryAh: number | null;
    batteryManufacturedOn: string | null;
    pathFailureReportMin: number | null;
  }> = {},
): Promise<Panel> {
  return Panel.create({
    tenantId: site.tenantId,
    siteId: site.id,
    label: overrides.label ?? 'Main panel',
    makeModel: overrides.makeModel ?? 'Test panel TP-64',
    zoneCapacity: overrides.zoneCapacity ?? 64,
    wirelessZoneFrom: overrides.wirelessZoneFrom ?? 9,
    wirelessZoneTo: overrides.wirelessZoneTo ?? 64,
    commPath: overrides.commPath ?? 'cellular',
    installedOn: '2025-03-14',
    settings: { ...CP01_DEFAULTS, ...(overrides.settings ?? {}) },
    changedSinceProgrammed: overrides.changedSinceProgrammed ?? false,
    occupancy: overrides.occupancy ?? 'household',
    standbyCurrentMa: overrides.standbyCurrentMa ?? null,
    alarmCurrentMa: overrides.alarmCurrentMa ?? null,
    batteryAh: overrides.batteryAh ?? null,
    batteryManufacturedOn: overrides.batteryManufacturedOn ?? null,
    pathFailureReportMin: overrides.pathFailureReportMin ?? null,
  });
}

/** A zone on this panel; behaviour from the device type's defaults unless given. */
export async function buildZone(
  panel: Panel,
  overrides: Partial<{
    number: number;
    description: string;
    deviceType: DeviceType;
    zoneType: ZoneType;
    serial: string;
    input: number;
    status: ZoneStatus;
    batteryType: string | null;
    installedOn: string | null;
    batteryChangedOn: string | null;
    manufacturedOn: string | null;
    reportsToMonitoring: boolean;
    supervised: boolean;
    chime: boolean;
    roomId: string | null;
    openingId: string | null;
  }> = {},
): Promise<Zone> {
  const deviceType = overrides.deviceType ?? 'window_contact';
  const defaults = zoneDefaultsFor(deviceType);
  return Zone.create({
    tenantId: panel.tenantId,
    siteId: panel.siteId,
    panelId: panel.id,
    number: overrides.number ?? panel.wirelessZoneFrom,
    description: overrides.description ?? 'Den window',
    deviceType,
    zoneType: overrides.zoneType ?? defaults.zoneType,
    serial: overrides.serial ?? '',
    input: overrides.input ?? 1,
    reportsToMonitoring: overrides.reportsToMonitoring ?? defaults.reportsToMonitoring,
    chime: overrides.chime ?? defaults.chime,
    supervised: overrides.supervised ?? defaults.supervised,
    status: overrides.status ?? 'active',
    roomId: overrides.roomId ?? null,
    openingId: overrides.openingId ?? null,
    installedOn: overrides.installedOn ?? null,
    batteryType: overrides.batteryType ?? null,
    batteryChangedOn: overrides.batteryChangedOn ?? null,
    manufacturedOn: overrides.manufacturedOn ?? null,
  });
}

// ---- Premises: floors, rooms, openings ----

/** A floor of this site: the ground floor unless given. */
export async function buildFloor(site: Site, overrides: Partial<{ name: string; level: number; belowGrade: boolean; planImageId: string | null; planImageContentType: string | null }> = {}): Promise<Floor> {
  return Floor.create({
    tenantId: site.tenantId,
    siteId: site.id,
    name: overrides.name ?? 'Ground floor',
    level: overrides.level ?? 0,
    belowGrade: overrides.belowGrade ?? false,
    planImageId: overrides.planImageId ?? null,
    planImageContentType: overrides.planImageContentType ?? null,
  });
}

/** A room on this floor: a living room unless given. */
export async function buildRoom(
  floor: Floor,
  overrides: Partial<{
    name: string;
    kind: RoomKind;
    fuelBurningAppliance: boolean;
    attachedGarage: boolean;
    position: number;
    /** a bedroom: the hall serving its sleeping area (not checked here: the API checks it) */
    servedByHallId: string | null;
    hallWithin21FtConfirmed: boolean;
    /** a bathroom: the bedroom it is attached to (not checked here) */
    attachedToBedroomId: string | null;
  }> = {},
): Promise<Room> {
  return Room.create({
    tenantId: floor.tenantId,
    siteId: floor.siteId,
    floorId: floor.id,
    name: overrides.name ?? 'Living room',
    kind: overrides.kind ?? 'living',
    fuelBurningAppliance: overrides.fuelBurningAppliance ?? false,
    attachedGarage: overrides.attachedGarage ?? false,
    servedByHallId: overrides.servedByHallId ?? null,
    hallWithin21FtConfirmed: overrides.hallWithin21FtConfirmed ?? false,
    attachedToBedroomId: overrides.attachedToBedroomId ?? null,
    position: overrides.position ?? 0,
  });
}

/** An opening of this room: a window reachable from the ground unless given. */
export async function buildOpening(
  room: Room,
  overrides: Partial<{ kind: OpeningKind; label: string; groundReachable: boolean; position: number }> = {},
): Promise<Opening> {
  return Opening.create({
    tenantId: room.tenantId,
    siteId: room.siteId,
    roomId: room.id,
    kind: overrides.kind ?? 'window',
    label: overrides.label ?? 'Front window',
    groundReachable: overrides.groundReachable ?? true,
    position: overrides.position ?? 0,
  });
}

// ---- Jobs ----

/**
 * A job at this site: a service call, requested, nothing assigned, unless given. A job with a
 * technician and a start is `scheduled` unless a state is given (as POST /api/jobs decides).
 */
export async function buildJob(
  site: Site,
  overrides: Partial<{
    kind: JobKind;
    state: JobState;
    technicianId: string | null;
    scheduledStart: Date | null;
    scheduledEnd: Date | null;
    summary: string;
    clientNotes: string;
    internalNotes: string;
    parts: JobPart[];
    checklist: ChecklistItem[];
    touchedZoneIds: string[];
    cancelReason: string;
    startedAt: Date | null;
    completedAt: Date | null;
    completedById: string | null;
  }> = {},
): Promise<Job> {
  const technicianId = overrides.technicianId ?? null;
  const scheduledStart = overrides.scheduledStart ?? null;
  return Job.create({
    tenantId: site.tenantId,
    siteId: site.id,
    kind: overrides.kind ?? 'service_call',
    state: overrides.state ?? (technicianId && scheduledStart ? 'scheduled' : 'requested'),
    technicianId,
    scheduledStart,
    scheduledEnd: overrides.scheduledEnd ?? null,
    summary: overrides.summary ?? 'Replace back-door contact',
    clientNotes: overrides.clientNotes ?? '',
    internalNotes: overrides.internalNotes ?? '',
    parts: overrides.parts ?? [],
    checklist: overrides.checklist ?? [],
    touchedZoneIds: overrides.touchedZoneIds ?? [],
    cancelReason: overrides.cancelReason ?? '',
    startedAt: overrides.startedAt ?? null,
    completedAt: overrides.completedAt ?? null,
    completedById: overrides.completedById ?? null,
  });
}
