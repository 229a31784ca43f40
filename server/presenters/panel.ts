import { auditPanelSettings } from '@domain/cp01';
import { panelPowerFindings, requiredStandbyAh, standbyBatteryDueOn, standbyDutyOf, STANDBY_REQUIREMENTS, type PanelPowerInput } from '@domain/panel-power';
import { bySeverity } from '@domain/severity';
import { nextFreeZoneNumber, occupyingZones } from '@domain/zones';
import type { Panel } from '../models/Panel';
import type { Zone } from '../models/Zone';
import type { ZoneChange } from '../models/ZoneChange';
import { settingsOf } from '../services/panels';
import { panelRangeOf, zoneLikeOf } from '../services/zones';

/** The panel's power and path as the checks read them. */
export function panelPowerOf(panel: Panel): PanelPowerInput {
  return {
    occupancy: panel.occupancy ?? 'household',
    commPath: panel.commPath,
    standbyCurrentMa: panel.standbyCurrentMa ?? null,
    alarmCurrentMa: panel.alarmCurrentMa ?? null,
    batteryAh: panel.batteryAh ?? null,
    batteryManufacturedOn: panel.batteryManufacturedOn ?? null,
    pathFailureReportMin: panel.pathFailureReportMin ?? null,
  };
}

/**
 * Every finding on a panel, most severe first: the CP-01 audit of its settings and of the
 * zone types its fire and CO devices are on (`topic: 'cp01'`), and its standby battery and
 * path to the monitoring center (`topic: 'power'`).
 */
export function panelFindings(panel: Panel, zones: readonly Zone[], today: string) {
  const settings = settingsOf(panel);
  const cp01 = auditPanelSettings(
    settings,
    zones.map((z) => ({ zoneType: z.zoneType, status: z.status ?? 'active', deviceType: z.deviceType, number: z.number, description: z.description })),
  ).map((f) => ({ ...f, topic: 'cp01' as const, lifeSafety: f.code === 'abort_window_on_fire_zones' || f.code === 'life_safety_device_on_wrong_zone' }));
  const power = panelPowerFindings(
    panelPowerOf(panel),
    zones.map((z) => ({ deviceType: z.deviceType, zoneType: z.zoneType, status: z.status ?? 'active', reportsToMonitoring: Boolean(z.reportsToMonitoring) })),
    today,
  ).map((f) => ({ ...f, topic: 'power' as const }));
  return bySeverity([...cp01, ...power]);
}

/** The standby battery worked out: the duty, its hours and minutes, what is needed and required, and when the fitted battery is due. */
export function standbyOf(panel: Panel, zones: readonly Zone[]) {
  const power = panelPowerOf(panel);
  const duty = standbyDutyOf(
    power.occupancy,
    zones.map((z) => ({ deviceType: z.deviceType, zoneType: z.zoneType, status: z.status ?? 'active', reportsToMonitoring: Boolean(z.reportsToMonitoring) })),
  );
  const req = STANDBY_REQUIREMENTS[duty];
  const calc = power.standbyCurrentMa !== null && power.alarmCurrentMa !== null ? requiredStandbyAh(duty, power.standbyCurrentMa, power.alarmCurrentMa) : null;
  return {
    duty,
    standbyHours: req.standbyHours,
    alarmMinutes: req.alarmMinutes,
    neededAh: calc?.neededAh ?? null,
    requiredAh: calc?.requiredAh ?? null,
    batteryDueOn: power.batteryManufacturedOn ? standbyBatteryDueOn(power.batteryManufacturedOn) : null,
  };
}

/**
 * A panel as staff see it (api-resources.md, "Panel"), with the read-only fields worked out
 * from its zones: `nextZoneNumber` (null when the wireless range is full), `zoneCount` (zones
 * in use), `standby` (the standby battery worked out) and `audit` (every finding: CP-01,
 * life-safety zone types, standby battery, communication path).
 */
export function presentPanel(panel: Panel, zones: readonly Zone[], today: string) {
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
    occupancy: panel.occupancy ?? 'household',
    standbyCurrentMa: panel.standbyCurrentMa ?? null,
    alarmCurrentMa: panel.alarmCurrentMa ?? null,
    batteryAh: panel.batteryAh ?? null,
    batteryManufacturedOn: panel.batteryManufacturedOn ?? null,
    pathFailureReportMin: panel.pathFailureReportMin ?? null,
    standby: standbyOf(panel, zones),
    settings,
    programmedAt: panel.programmedAt ? new Date(panel.programmedAt).toISOString() : null,
    changedSinceProgrammed: Boolean(panel.changedSinceProgrammed),
    nextZoneNumber: nextFreeZoneNumber(panelRangeOf(panel), likes),
    zoneCount: occupyingZones(likes).length,
    audit: panelFindings(panel, zones, today),
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
