import type { Zone } from '../models/Zone';
import { type ZoneViewContext, zoneValuesOf, zoneViewOf } from '../services/zones';

/**
 * A zone as staff see it (api-resources.md, "Zone"), with `life` (device life on the site's
 * today, the firm's upkeep model), `elsewhere` (the same serial in service on the firm's
 * other panels) and `warnings` (notes that did not block saving, e.g. a number outside the
 * wireless range). Portal presenters for clients must leave out `serial` and `elsewhere`.
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
    life: extra.life,
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
