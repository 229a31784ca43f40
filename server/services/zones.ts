/**
 * Zone operations on a panel: create, update, delete, each checked against the panel's other
 * zones (src/domain/zones.ts) inside one transaction, logged to the zone change log and the
 * audit trail, and marking the panel "changed since last programmed" when a programmed field
 * changes. Also what a zone's JSON needs beyond its row: device life and the same serial
 * elsewhere in the firm.
 */
import { Op } from 'sequelize';
import { type ZoneStatus } from '@domain/devices';
import { deviceLife, mergeUpkeepSettings, type DeviceLife, type UpkeepSettings } from '@domain/device-life';
import { checkLifeSafetyZone, type LifeSafetyZoneInput, type LifeSafetyZoneProblem } from '@domain/life-safety-zone';
import { type ZoneValues, type zoneCreateSchema, type zonePatchSchema } from '@domain/schemas/zone';
import {
  type ChangeSet,
  type PanelRange,
  type ZoneElsewhere,
  type ZoneLike,
  type ZoneProblem,
  ZONE_CHANGE_FIELDS,
  marksPanelChanged,
  nextFreeZoneNumber,
  serialElsewhereNote,
  serialsElsewhere,
  zoneChangeSet,
  zoneDefaultsFor,
  zoneProblems,
  zoneWarnings,
} from '@domain/zones';
import type { z } from 'zod';
import { type Ctx, scoped } from '../context';
import { HttpError, errors } from '../errors';
import { Panel } from '../models/Panel';
import { Site } from '../models/Site';
import type { Tenant } from '../models/Tenant';
import { Zone } from '../models/Zone';
import { ZoneChange } from '../models/ZoneChange';
import { recordAudit } from './audit-recorder';
import { resolvePremisesLinks } from './premises-links';

export type ZonePatch = z.output<typeof zonePatchSchema>;
export type ZoneCreateValues = z.output<typeof zoneCreateSchema>;

/** Every field of a zone the change log follows: the programmed ones first, then the rest. */
export const ZONE_LOGGED_FIELDS = [
  ...ZONE_CHANGE_FIELDS,
  'roomId',
  'openingId',
  'installedOn',
  'batteryType',
  'batteryChangedOn',
  'manufacturedOn',
] as const satisfies readonly (keyof ZoneValues)[];

/** The zone's editable values as a plain object (what the change log compares). */
export function zoneValuesOf(zone: Zone): ZoneValues {
  return {
    number: zone.number,
    description: zone.description,
    deviceType: zone.deviceType,
    zoneType: zone.zoneType,
    serial: zone.serial ?? '',
    input: zone.input ?? 1,
    reportsToMonitoring: Boolean(zone.reportsToMonitoring),
    chime: Boolean(zone.chime),
    supervised: Boolean(zone.supervised),
    status: zone.status ?? 'active',
    roomId: zone.roomId ?? null,
    openingId: zone.openingId ?? null,
    installedOn: zone.installedOn ?? null,
    batteryType: zone.batteryType ?? null,
    batteryChangedOn: zone.batteryChangedOn ?? null,
    manufacturedOn: zone.manufacturedOn ?? null,
  };
}

/** What the zone rules need to know about a saved zone. */
export function zoneLikeOf(zone: Zone): ZoneLike {
  return { id: zone.id, number: zone.number, serial: zone.serial ?? '', input: zone.input ?? 1, status: zone.status ?? 'active', description: zone.description };
}

/** What the zone rules need to know about a panel. */
export function panelRangeOf(panel: Panel): PanelRange {
  return { zoneCapacity: panel.zoneCapacity, wirelessZoneFrom: panel.wirelessZoneFrom, wirelessZoneTo: panel.wirelessZoneTo };
}

const STATUS_RANK: Record<ZoneStatus, number> = { active: 0, bypassed: 1, removed: 2 };

/** The order of a zone list: by number; a removed zone after the zone now holding its number. */
export function compareZones(a: Zone, b: Zone): number {
  return (
    a.number - b.number ||
    STATUS_RANK[a.status as ZoneStatus] - STATUS_RANK[b.status as ZoneStatus] ||
    a.description.localeCompare(b.description) ||
    (a.serial ?? '').localeCompare(b.serial ?? '') ||
    (a.input ?? 1) - (b.input ?? 1) ||
    a.id.localeCompare(b.id)
  );
}

/** Every zone of a panel (removed ones included), in list order. */
export async function panelZones(ctx: Ctx, panelId: string): Promise<Zone[]> {
  const zones = await Zone.findAll({ where: scoped(ctx, { panelId }), transaction: ctx.transaction ?? null });
  return zones.sort(compareZones);
}

/** A panel re-read inside the caller's transaction (a write checks against the saved panel); 404 if gone. */
export async function reloadPanel(ctx: Ctx, panelId: string): Promise<Panel> {
  const panel = await Panel.findOne({ where: scoped(ctx, { id: panelId }), transaction: ctx.transaction ?? null });
  if (!panel) throw errors.notFound('panel');
  return panel;
}

// ---------------------------------------------------------------------------------------------
// What a zone's JSON needs beyond its row
// ---------------------------------------------------------------------------------------------

/** Today's calendar date ('YYYY-MM-DD') in a time zone; UTC when the zone is unknown. */
export function todayIn(timeZone: string | null | undefined, now: Date): string {
  const format = (tz: string) => {
    const parts = new Intl.DateTimeFormat('en-US', { timeZone: tz, year: 'numeric', month: '2-digit', day: '2-digit' }).formatToParts(now);
    const part = (type: string) => parts.find((p) => p.type === type)?.value ?? '';
    return `${part('year')}-${part('month')}-${part('day')}`;
  };
  try {
    return format(timeZone || 'UTC');
  } catch {
    return format('UTC');
  }
}

/** The firm's upkeep settings over the defaults (Tenant.upkeepSettings holds only the overrides). */
export function upkeepOf(tenant: Pick<Tenant, 'upkeepSettings'> | null): UpkeepSettings {
  const saved = tenant?.upkeepSettings;
  return mergeUpkeepSettings(saved && typeof saved === 'object' ? (saved as Partial<UpkeepSettings>) : null);
}

/** A zone on another panel of the firm that uses the same serial. */
export interface ElsewherePlace extends ZoneElsewhere {
  zoneId: string;
  panelId: string;
  siteId: string;
}

/** Where each of these serials is also in service on the firm's other panels (removed zones do not count). */
export async function findSerialsElsewhere(ctx: Ctx, panelId: string, serials: readonly string[]): Promise<Map<string, ElsewherePlace[]>> {
  const wanted = [...new Set(serials.filter((s) => s.trim() !== ''))];
  const found = new Map<string, ElsewherePlace[]>();
  if (wanted.length === 0) return found;
  const zones = await Zone.findAll({
    where: scoped(ctx, { serial: { [Op.in]: wanted }, panelId: { [Op.ne]: panelId }, status: { [Op.ne]: 'removed' } }),
    order: [['number', 'ASC']],
    transaction: ctx.transaction ?? null,
  });
  if (zones.length === 0) return found;
  const panelIds = [...new Set(zones.map((z) => z.panelId))];
  const panels = await Panel.findAll({ where: scoped(ctx, { id: { [Op.in]: panelIds } }), transaction: ctx.transaction ?? null });
  const siteIds = [...new Set(panels.map((p) => p.siteId))];
  const sites = await Site.findAll({ where: scoped(ctx, { id: { [Op.in]: siteIds } }), transaction: ctx.transaction ?? null });
  const panelById = new Map(panels.map((p) => [p.id, p]));
  const siteById = new Map(sites.map((s) => [s.id, s]));
  const places: ElsewherePlace[] = zones.map((zone) => {
    const panel = panelById.get(zone.panelId);
    const site = panel ? siteById.get(panel.siteId) : undefined;
    return {
      zoneId: zone.id,
      panelId: zone.panelId,
      siteId: zone.siteId,
      serial: zone.serial,
      number: zone.number,
      panelLabel: panel?.label ?? 'another panel',
      siteName: site?.name ?? 'another site',
    };
  });
  for (const serial of wanted) {
    const here = serialsElsewhere(serial, places);
    if (here.length > 0) found.set(serial, here);
  }
  return found;
}

/** What presenting a panel's zones needs: today at the site, the firm's upkeep model, the panel, serials elsewhere. */
export interface ZoneViewContext {
  today: string;
  upkeep: UpkeepSettings;
  panel: PanelRange;
  elsewhere: Map<string, ElsewherePlace[]>;
  /** the panel's zones, for the life-safety check of a combination alarm's two halves */
  siblings: LifeSafetyZoneInput[];
}

/** What the life-safety zone check needs of a zone. */
export function lifeSafetyInputOf(zone: Zone): LifeSafetyZoneInput {
  return {
    id: zone.id,
    number: zone.number,
    description: zone.description,
    deviceType: zone.deviceType,
    zoneType: zone.zoneType,
    reportsToMonitoring: Boolean(zone.reportsToMonitoring),
    supervised: Boolean(zone.supervised),
    status: zone.status ?? 'active',
    serial: zone.serial ?? '',
    panelId: zone.panelId,
  };
}

export async function zoneViewContext(ctx: Ctx, panel: Panel, zones: readonly Zone[], now: Date): Promise<ZoneViewContext> {
  const site = await Site.findOne({ where: scoped(ctx, { id: panel.siteId }), transaction: ctx.transaction ?? null });
  return {
    today: todayIn(site?.timeZone ?? ctx.tenant?.timeZone, now),
    upkeep: upkeepOf(ctx.tenant),
    panel: panelRangeOf(panel),
    elsewhere: await findSerialsElsewhere(
      ctx,
      panel.id,
      zones.map((z) => z.serial),
    ),
    siblings: (await panelZones(ctx, panel.id)).map(lifeSafetyInputOf),
  };
}

export interface ZoneView {
  life: DeviceLife;
  lifeSafetyProblems: LifeSafetyZoneProblem[];
  elsewhere: (ElsewherePlace & { note: string })[];
  warnings: ZoneProblem[];
}

/** Device life, serial elsewhere and non-blocking warnings of one zone. */
export function zoneViewOf(zone: Zone, view: ZoneViewContext): ZoneView {
  const values = zoneValuesOf(zone);
  return {
    life: deviceLife(values, view.upkeep, view.today),
    lifeSafetyProblems: values.status === 'removed' ? [] : checkLifeSafetyZone(lifeSafetyInputOf(zone), view.siblings).problems,
    elsewhere: (view.elsewhere.get(values.serial) ?? []).map((place) => ({ ...place, note: serialElsewhereNote(place) })),
    warnings: values.status === 'removed' ? [] : zoneWarnings({ id: zone.id, number: values.number, serial: values.serial, input: values.input }, view.panel),
  };
}

// ---------------------------------------------------------------------------------------------
// Refusals
// ---------------------------------------------------------------------------------------------

/**
 * The answer to zone problems: a number beyond capacity is bad input (400 naming `number`);
 * a clash is a conflict (409) — `zone_number_taken` when the number is taken, `conflict` when
 * only the serial+input is — with `fields` naming each clashing field and the domain's message,
 * which names the zone it clashes with. Null when there is no problem.
 */
export function refusalFor(problems: readonly ZoneProblem[]): HttpError | null {
  const capacity = problems.find((p) => p.code === 'over_capacity');
  if (capacity) return errors.validation(capacity.message, { number: capacity.message });
  const clashes = problems.filter((p) => p.code === 'zone_number_taken' || p.code === 'serial_input_taken');
  if (clashes.length === 0) return null;
  const fields: Record<string, string> = {};
  for (const clash of clashes) fields[clash.field] ??= clash.message;
  const numberTaken = clashes.some((p) => p.code === 'zone_number_taken');
  return new HttpError(409, numberTaken ? 'zone_number_taken' : 'conflict', clashes.map((c) => c.message).join(' '), fields);
}

/** "Every wireless zone number … is in use": the create refusal when no number is given and none is free. */
export function panelFullMessage(panel: PanelRange): string {
  const last = Math.min(panel.wirelessZoneTo, panel.zoneCapacity);
  return `Every wireless zone number on this panel (${panel.wirelessZoneFrom}–${last}) is in use. Enter a zone number from 1 to ${panel.zoneCapacity} yourself, or remove a zone first.`;
}

// ---------------------------------------------------------------------------------------------
// Change log
// ---------------------------------------------------------------------------------------------

/**
 * Writes one change-log row and, when the change touches a programmed field, marks the panel
 * "changed since last programmed". Call inside the caller's transaction.
 */
export async function logZoneChange(
  ctx: Ctx,
  panel: Panel,
  entry: { zoneId: string | null; zoneNumber: number | null; action: ZoneChange['action']; changes: ChangeSet; marksPanel?: boolean },
): Promise<void> {
  await ZoneChange.create(
    {
      tenantId: panel.tenantId,
      panelId: panel.id,
      zoneId: entry.zoneId,
      zoneNumber: entry.zoneNumber,
      action: entry.action,
      changes: entry.changes,
      actorId: ctx.user?.id ?? null,
      actorName: ctx.user?.name ?? '',
    },
    { transaction: ctx.transaction ?? null },
  );
  const marks = entry.marksPanel ?? marksPanelChanged(entry.changes);
  if (marks && !panel.changedSinceProgrammed) await panel.update({ changedSinceProgrammed: true }, { transaction: ctx.transaction ?? null });
}

// ---------------------------------------------------------------------------------------------
// Create, update, delete
// ---------------------------------------------------------------------------------------------

/** A new zone's full values: the next free number and the device type's behaviour where none is given. */
export function completeZoneValues(input: ZoneCreateValues, number: number): ZoneValues {
  const defaults = zoneDefaultsFor(input.deviceType);
  return {
    ...input,
    number,
    zoneType: input.zoneType ?? defaults.zoneType,
    reportsToMonitoring: input.reportsToMonitoring ?? defaults.reportsToMonitoring,
    chime: input.chime ?? defaults.chime,
    supervised: input.supervised ?? defaults.supervised,
  };
}

/**
 * Adds a zone to a panel (call inside a transaction): number and behaviour defaults filled,
 * room and opening checked against the panel's site (400 naming `roomId` / `openingId`),
 * capacity and clashes checked against the panel's zones as saved, logged and audited.
 */
export async function createZone(ctx: Ctx, panelId: string, given: ZoneCreateValues): Promise<{ zone: Zone; panel: Panel }> {
  const panel = await reloadPanel(ctx, panelId);
  // a room or opening must be of the panel's own site; an opening alone puts the zone in its room
  const links = await resolvePremisesLinks(ctx, panel.siteId, { roomId: given.roomId, openingId: given.openingId });
  const input: ZoneCreateValues = { ...given, roomId: links.roomId ?? null, openingId: links.openingId ?? null };
  const zones = (await panelZones(ctx, panel.id)).map(zoneLikeOf);
  const range = panelRangeOf(panel);
  const number = input.number ?? nextFreeZoneNumber(range, zones);
  if (number === null) {
    const message = panelFullMessage(range);
    throw errors.validation(message, { number: message });
  }
  const values = completeZoneValues(input, number);
  const refusal = values.status === 'removed' ? null : refusalFor(zoneProblems({ number, serial: values.serial, input: values.input }, range, zones));
  if (refusal) throw refusal;
  const zone = await Zone.create(
    { ...values, tenantId: panel.tenantId, siteId: panel.siteId, panelId: panel.id },
    { transaction: ctx.transaction ?? null },
  );
  await logZoneChange(ctx, panel, {
    zoneId: zone.id,
    zoneNumber: zone.number,
    action: 'created',
    changes: zoneChangeSet({}, values, ZONE_LOGGED_FIELDS),
    marksPanel: values.status !== 'removed',
  });
  await recordAudit(ctx, { action: 'zone.created', subjectType: 'Zone', subjectId: zone.id, details: { panelId: panel.id, number: zone.number } });
  return { zone, panel };
}

/**
 * Changes a zone (call inside a transaction). Only the fields sent change. A zone that is (or
 * becomes) removed holds no number or serial, so it is not checked for clashes; every other
 * zone is checked against the panel's zones as saved. A room or opening sent must be of the
 * zone's site. Nothing is written when nothing changed.
 */
export async function updateZone(ctx: Ctx, zoneId: string, patch: ZonePatch): Promise<{ zone: Zone; panel: Panel; changes: ChangeSet }> {
  const zone = await Zone.findOne({ where: scoped(ctx, { id: zoneId }), transaction: ctx.transaction ?? null });
  if (!zone) throw errors.notFound('zone');
  const panel = await reloadPanel(ctx, zone.panelId);
  const before = zoneValuesOf(zone);
  // a room or opening must be of the zone's own site; an opening alone puts the zone in its room
  const links = await resolvePremisesLinks(ctx, panel.siteId, { roomId: patch.roomId, openingId: patch.openingId });
  const after: ZoneValues = { ...before, ...definedOnly({ ...patch, ...definedOnly(links) }) };
  if (after.status !== 'removed') {
    const zones = (await panelZones(ctx, panel.id)).map(zoneLikeOf);
    const refusal = refusalFor(zoneProblems({ id: zone.id, number: after.number, serial: after.serial, input: after.input }, panelRangeOf(panel), zones));
    if (refusal) throw refusal;
  }
  const changes = zoneChangeSet(before, after, ZONE_LOGGED_FIELDS);
  if (Object.keys(changes).length === 0) return { zone, panel, changes };
  await zone.update(after, { transaction: ctx.transaction ?? null });
  const removing = before.status !== 'removed' && after.status === 'removed';
  await logZoneChange(ctx, panel, {
    zoneId: zone.id,
    zoneNumber: zone.number,
    action: removing ? 'removed' : 'updated',
    changes,
    // editing a zone that stays removed changes nothing programmed on the panel
    marksPanel: before.status === 'removed' && after.status === 'removed' ? false : marksPanelChanged(changes),
  });
  await recordAudit(ctx, {
    action: removing ? 'zone.removed' : 'zone.updated',
    subjectType: 'Zone',
    subjectId: zone.id,
    details: { panelId: panel.id, number: zone.number, changed: Object.keys(changes) },
  });
  return { zone, panel, changes };
}

/**
 * Deletes a zone outright (call inside a transaction). Its change-log rows stay, plus one
 * 'deleted' row holding its last values. Deleting a zone that was already removed changes
 * nothing programmed on the panel.
 */
export async function deleteZone(ctx: Ctx, zoneId: string): Promise<void> {
  const zone = await Zone.findOne({ where: scoped(ctx, { id: zoneId }), transaction: ctx.transaction ?? null });
  if (!zone) throw errors.notFound('zone');
  const panel = await reloadPanel(ctx, zone.panelId);
  const before = zoneValuesOf(zone);
  await zone.destroy({ transaction: ctx.transaction ?? null });
  const changes = zoneChangeSet(before, {}, ZONE_LOGGED_FIELDS);
  await logZoneChange(ctx, panel, {
    zoneId: zone.id,
    zoneNumber: before.number,
    action: 'deleted',
    changes,
    marksPanel: before.status !== 'removed' && marksPanelChanged(changes),
  });
  await recordAudit(ctx, { action: 'zone.deleted', subjectType: 'Zone', subjectId: zone.id, details: { panelId: panel.id, number: before.number } });
}

/** The entries of an object whose value is not undefined (a PATCH body: fields left out stay). */
export function definedOnly<T extends object>(value: T): Partial<T> {
  return Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as Partial<T>;
}

