/**
 * Panel operations: create (settings default to CP-01), update (settings merged field by
 * field), delete, "programmed" and the change log. Each runs inside the caller's transaction
 * and writes an audit event in it.
 */
import { Op } from 'sequelize';
import { CP01_DEFAULTS, type PanelSettings } from '@domain/cp01';
import { type panelPatchSchema, type panelSchema } from '@domain/schemas/panel';
import { type ChangeSet, occupyingZones } from '@domain/zones';
import type { z } from 'zod';
import { type Ctx, scoped } from '../context';
import { errors } from '../errors';
import { Panel } from '../models/Panel';
import type { Site } from '../models/Site';
import { Zone } from '../models/Zone';
import { ZoneChange } from '../models/ZoneChange';
import { recordAudit } from './audit-recorder';
import { definedOnly, logZoneChange, panelZones, reloadPanel } from './zones';

export type PanelInput = z.output<typeof panelSchema>;
export type PanelPatch = z.output<typeof panelPatchSchema>;

const SETTING_KEYS = Object.keys(CP01_DEFAULTS) as (keyof PanelSettings)[];

/** A panel's saved settings over the CP-01 defaults, with only the known keys. */
export function settingsOf(panel: Pick<Panel, 'settings'>): PanelSettings {
  const saved = (panel.settings ?? {}) as Partial<PanelSettings>;
  const out: PanelSettings = { ...CP01_DEFAULTS };
  for (const key of SETTING_KEYS) {
    const value = saved[key];
    if (value !== undefined && value !== null) (out as unknown as Record<string, unknown>)[key] = value;
  }
  return out;
}

/** Adds a panel to a site; settings not given start at the CP-01 defaults. */
export async function createPanel(ctx: Ctx, site: Site, input: PanelInput): Promise<Panel> {
  const panel = await Panel.create(
    {
      tenantId: site.tenantId,
      siteId: site.id,
      label: input.label,
      makeModel: input.makeModel,
      zoneCapacity: input.zoneCapacity,
      wirelessZoneFrom: input.wirelessZoneFrom,
      wirelessZoneTo: input.wirelessZoneTo,
      commPath: input.commPath,
      installedOn: input.installedOn,
      occupancy: input.occupancy,
      standbyCurrentMa: input.standbyCurrentMa,
      alarmCurrentMa: input.alarmCurrentMa,
      batteryAh: input.batteryAh,
      batteryManufacturedOn: input.batteryManufacturedOn,
      pathFailureReportMin: input.pathFailureReportMin,
      settings: { ...CP01_DEFAULTS, ...(input.settings ?? {}) },
    },
    { transaction: ctx.transaction ?? null },
  );
  await recordAudit(ctx, { action: 'panel.created', subjectType: 'Panel', subjectId: panel.id, details: { siteId: site.id, label: panel.label } });
  return panel;
}

/**
 * Changes a panel: only the fields sent; `settings` merged key by key. The range is checked on
 * the merged values (first ≤ last ≤ capacity), and the capacity may not drop below a zone in
 * use. A change of settings is programmed into the panel: it goes to the change log (as
 * `settings.<key>`) and marks the panel "changed since last programmed".
 */
export async function updatePanel(ctx: Ctx, panelId: string, patch: PanelPatch): Promise<Panel> {
  const panel = await reloadPanel(ctx, panelId);
  const { settings: settingsPatch, ...fields } = definedOnly(patch);
  const next = {
    zoneCapacity: fields.zoneCapacity ?? panel.zoneCapacity,
    wirelessZoneFrom: fields.wirelessZoneFrom ?? panel.wirelessZoneFrom,
    wirelessZoneTo: fields.wirelessZoneTo ?? panel.wirelessZoneTo,
  };
  if (next.wirelessZoneFrom > next.wirelessZoneTo) {
    const message = 'The last wireless zone must not come before the first.';
    throw errors.validation(message, { [fields.wirelessZoneFrom !== undefined && fields.wirelessZoneTo === undefined ? 'wirelessZoneFrom' : 'wirelessZoneTo']: message });
  }
  if (next.wirelessZoneTo > next.zoneCapacity) {
    const message = `The panel holds ${next.zoneCapacity} zones; the wireless range must end at ${next.zoneCapacity} or below.`;
    throw errors.validation(message, { [fields.zoneCapacity !== undefined && fields.wirelessZoneTo === undefined ? 'zoneCapacity' : 'wirelessZoneTo']: message });
  }
  if (next.zoneCapacity < panel.zoneCapacity) {
    const beyond = occupyingZones(await panelZones(ctx, panel.id)).filter((z) => z.number > next.zoneCapacity);
    const first = beyond[0];
    if (first) {
      const more = beyond.length > 1 ? ` and ${beyond.length - 1} more` : '';
      const message = `Zone ${first.number} (“${first.description}”)${more} is above ${next.zoneCapacity}. Renumber or remove ${beyond.length > 1 ? 'them' : 'it'} first.`;
      throw errors.validation(message, { zoneCapacity: message });
    }
  }

  const beforeSettings = settingsOf(panel);
  const afterSettings: PanelSettings = { ...beforeSettings, ...definedOnly(settingsPatch ?? {}) };
  const settingChanges: ChangeSet = {};
  for (const key of SETTING_KEYS) {
    if (beforeSettings[key] !== afterSettings[key]) settingChanges[`settings.${key}`] = [beforeSettings[key], afterSettings[key]];
  }
  const plain = panel.get({ plain: true }) as unknown as Record<string, unknown>;
  const changed = Object.entries(fields)
    .filter(([key, value]) => plain[key] !== value)
    .map(([key]) => key);

  await panel.update({ ...fields, settings: afterSettings }, { transaction: ctx.transaction ?? null });
  if (Object.keys(settingChanges).length > 0) {
    await logZoneChange(ctx, panel, { zoneId: null, zoneNumber: null, action: 'updated', changes: settingChanges, marksPanel: true });
  }
  const allChanged = [...changed, ...Object.keys(settingChanges)];
  if (allChanged.length > 0) {
    await recordAudit(ctx, { action: 'panel.updated', subjectType: 'Panel', subjectId: panel.id, details: { changed: allChanged } });
  }
  return panel;
}

/** Deletes a panel with its zones and change log; the audit event keeps what was deleted. */
export async function deletePanel(ctx: Ctx, panelId: string): Promise<void> {
  const panel = await reloadPanel(ctx, panelId);
  const transaction = ctx.transaction ?? null;
  const zoneCount = await Zone.count({ where: scoped(ctx, { panelId: panel.id }), transaction });
  await ZoneChange.destroy({ where: scoped(ctx, { panelId: panel.id }), transaction });
  await Zone.destroy({ where: scoped(ctx, { panelId: panel.id }), transaction });
  await panel.destroy({ transaction });
  await recordAudit(ctx, {
    action: 'panel.deleted',
    subjectType: 'Panel',
    subjectId: panel.id,
    details: { siteId: panel.siteId, label: panel.label, zoneCount },
  });
}

/** Records that the panel was programmed now: clears "changed since last programmed", logged and audited. */
export async function markPanelProgrammed(ctx: Ctx, panelId: string, now: Date): Promise<Panel> {
  const panel = await reloadPanel(ctx, panelId);
  const before = { programmedAt: panel.programmedAt?.toISOString() ?? null, changedSinceProgrammed: Boolean(panel.changedSinceProgrammed) };
  await panel.update({ programmedAt: now, changedSinceProgrammed: false }, { transaction: ctx.transaction ?? null });
  await logZoneChange(ctx, panel, {
    zoneId: null,
    zoneNumber: null,
    action: 'programmed',
    changes: {
      programmedAt: [before.programmedAt, now.toISOString()],
      changedSinceProgrammed: [before.changedSinceProgrammed, false],
    },
    marksPanel: false,
  });
  await recordAudit(ctx, {
    action: 'panel.programmed',
    subjectType: 'Panel',
    subjectId: panel.id,
    details: { programmedAt: now.toISOString(), hadChanges: before.changedSinceProgrammed },
  });
  return panel;
}

/** One page of a panel's change log, newest first (an import's rows by zone number). */
export async function panelChanges(ctx: Ctx, panelId: string, page: number, pageSize: number) {
  return ZoneChange.findAndCountAll({
    where: scoped(ctx, { panelId }),
    order: [
      ['createdAt', 'DESC'],
      ['zoneNumber', 'ASC'],
      ['id', 'ASC'],
    ],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  });
}

/** The zones of several panels, grouped by panel (for a list of panels). */
export async function zonesByPanel(ctx: Ctx, panelIds: readonly string[]): Promise<Map<string, Zone[]>> {
  const grouped = new Map<string, Zone[]>(panelIds.map((id) => [id, []]));
  if (panelIds.length === 0) return grouped;
  const zones = await Zone.findAll({ where: scoped(ctx, { panelId: { [Op.in]: [...panelIds] } }) });
  for (const zone of zones) grouped.get(zone.panelId)?.push(zone);
  return grouped;
}
