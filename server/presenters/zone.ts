import type { Zone } from '../models/Zone';
import { type ZoneViewContext, zoneValuesOf, zoneViewOf } from '../services/zones';

/** A zone's pin on a floor plan (fractions of the image's width and height), or null. */
export function pinOf(zone: Pick<Zone, 'pinFloorId' | 'pinX' | 'pinY'>): { floorId: string; x: number; y: number } | null {
  if (!zone.pinFloorId || zone.pinX === null || zone.pinX === undefined || zone.pinY === null || zone.pinY === undefined) return null;
  return { floorId: zone.pinFloorId, x: zone.pinX, y: zone.pinY };
}

/**
 * A zone as staff see it (api-resources.md, "Zone"), with `life` (device life on the site's
 * today, the firm's upkeep model), `elsewhere` (the same serial in service on the firm's
 * other panels), `warnings` (notes that did not block saving, e.g. a number outside the
 * wireless range) and `pin` (its place on a floor plan, or null). Portal presenters for
 * clients must leave out `serial` and `elsewhere`.
 */
export function presentZone(zone: Zone, view: ZoneViewContext) {
  const values = zoneValuesOf(zone);
  const extra = zoneViewOf(zone, view);
  return {
    id: zone.id,
    panelId: zone.panelId,
    siteId: zone.siteId,
    number: values.number,
    description: values.description,
    deviceType: values.deviceType,
    zoneType: values.zoneType,
    serial: values.serial,
    input: values.input,
    reportsToMonitoring: values.reportsToMonitoring,
    chime: values.chime,
    supervised: values.supervised,
    status: values.status,
    roomId: values.roomId,
    openingId: values.openingId,
    installedOn: values.installedOn,
    batteryType: values.batteryType,
    batteryChangedOn: values.batteryChangedOn,
    manufacturedOn: values.manufacturedOn,
    pin: pinOf(zone),
    life: extra.life,
    /** how a smoke, heat or CO device's zone keeps it from protecting, and what to change (empty when it protects) */
    lifeSafetyProblems: extra.lifeSafetyProblems.map((p) => ({ code: p.code, field: p.field, what: p.what, fix: p.fix })),
    elsewhere: extra.elsewhere.map((place) => ({
      zoneId: place.zoneId,
      panelId: place.panelId,
      siteId: place.siteId,
      panelLabel: place.panelLabel,
      siteName: place.siteName,
      number: place.number,
      note: place.note,
    })),
    warnings: extra.warnings.map((w) => ({ code: w.code, field: w.field, message: w.message })),
    createdAt: zone.createdAt.toISOString(),
    updatedAt: zone.updatedAt.toISOString(),
  };
}
export type PresentedZone = ReturnType<typeof presentZone>;
