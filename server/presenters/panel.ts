import { auditPanelSettings } from '@domain/cp01';
import { nextFreeZoneNumber, occupyingZones } from '@domain/zones';
import type { Panel } from '../models/Panel';
import type { Zone } from '../models/Zone';
import type { ZoneChange } from '../models/ZoneChange';
import { settingsOf } from '../services/panels';
import { panelRangeOf, zoneLikeOf } from '../services/zones';

/**
 * A panel as staff see it (api-resources.md, "Panel"), with the read-only fields worked out
 * from its zones: `nextZoneNumber` (null when the wireless range is full), `zoneCount` (zones
 * in use) and `audit` (the CP-01 findings of its settings).
 */
export function presentPanel(panel: Panel, zones: readonly Zone[]) {
  const settings = settingsOf(panel);
  const likes = zones.map(zoneLikeOf);
  return {
    id: panel.id,
    siteId: panel.siteId,
    label: panel.label,
    makeModel: panel.makeModel ?? '',
    zoneCapacity: panel.zoneCapacity,
    wirelessZoneFrom: panel.wirelessZoneFrom,
    wirelessZoneTo: panel.wirelessZoneTo,
    commPath: panel.commPath,
    installedOn: panel.installedOn ?? null,
    settings,
    programmedAt: panel.programmedAt ? new Date(panel.programmedAt).toISOString() : null,
    changedSinceProgrammed: Boolean(panel.changedSinceProgrammed),
    nextZoneNumber: nextFreeZoneNumber(panelRangeOf(panel), likes),
    zoneCount: occupyingZones(likes).length,
    audit: auditPanelSettings(
      settings,
      zones.map((z) => ({ zoneType: z.zoneType, status: z.status })),
    ),
    createdAt: panel.createdAt.toISOString(),
    updatedAt: panel.updatedAt.toISOString(),
  };
}
export type PresentedPanel = ReturnType<typeof presentPanel>;

/** One change-log entry: who, when, which zone, what, old → new per field. */
export function presentZoneChange(change: ZoneChange) {
  return {
    id: change.id,
    at: change.createdAt.toISOString(),
    actorId: change.actorId,
    actorName: change.actorName,
    zoneId: change.zoneId,
    zoneNumber: change.zoneNumber,
    action: change.action,
    changes: Object.entries(change.changes ?? {}).map(([field, [from, to]]) => ({ field, from, to })),
  };
}
