/**
 * A site's coverage (api-resources.md, "Coverage"): its floors, rooms and openings and every
 * zone of every panel of the site, through the pure computation in src/domain/coverage.ts,
 * with the life-safety caution when the result calls for it. The staff route and the client
 * portal both use it (each with its own presenter).
 */
import { type CoverageResult, computeCoverage, coverageCaution } from '@domain/coverage';
import type { LIFE_SAFETY_CAUTION } from '@domain/life-safety';
import { type Ctx, scoped } from '../context';
import { Floor } from '../models/Floor';
import { Opening } from '../models/Opening';
import { Room } from '../models/Room';
import { Zone } from '../models/Zone';

export interface SiteCoverage extends CoverageResult {
  /** the life-safety caution, word for word, or null when nothing calls for it */
  caution: typeof LIFE_SAFETY_CAUTION | null;
}

/**
 * The coverage of one site of the acting user's firm. The caller has already checked that the
 * user may read the site's premises; every query here is scoped to the firm and the site.
 */
export async function coverageForSite(ctx: Ctx, siteId: string): Promise<SiteCoverage> {
  const options = { transaction: ctx.transaction ?? null };
  const [floors, rooms, openings, zones] = await Promise.all([
    Floor.findAll({ where: scoped(ctx, { siteId }), attributes: ['id', 'name', 'level', 'belowGrade'], ...options }),
    Room.findAll({
      where: scoped(ctx, { siteId }),
      attributes: ['id', 'floorId', 'name', 'kind', 'fuelBurningAppliance', 'attachedGarage', 'servedByHallId', 'hallWithin21FtConfirmed', 'attachedToBedroomId'],
      ...options,
    }),
    Opening.findAll({ where: scoped(ctx, { siteId }), attributes: ['id', 'roomId', 'kind', 'label', 'groundReachable'], ...options }),
    Zone.findAll({
      where: scoped(ctx, { siteId }),
      attributes: ['id', 'panelId', 'number', 'description', 'deviceType', 'zoneType', 'reportsToMonitoring', 'supervised', 'serial', 'status', 'roomId', 'openingId'],
      ...options,
    }),
  ]);
  const result = computeCoverage({
    floors: floors.map((f) => ({ id: f.id, name: f.name, level: f.level, belowGrade: Boolean(f.belowGrade) })),
    rooms: rooms.map((r) => ({
      id: r.id,
      floorId: r.floorId,
      name: r.name,
      kind: r.kind,
      fuelBurningAppliance: Boolean(r.fuelBurningAppliance),
      attachedGarage: Boolean(r.attachedGarage),
      servedByHallId: r.servedByHallId ?? null,
      hallWithin21FtConfirmed: Boolean(r.hallWithin21FtConfirmed),
      attachedToBedroomId: r.attachedToBedroomId ?? null,
    })),
    openings: openings.map((o) => ({ id: o.id, roomId: o.roomId, kind: o.kind, label: o.label, groundReachable: Boolean(o.groundReachable) })),
    zones: zones.map((z) => ({
      id: z.id,
      panelId: z.panelId,
      number: z.number,
      description: z.description,
      deviceType: z.deviceType,
      zoneType: z.zoneType,
      reportsToMonitoring: Boolean(z.reportsToMonitoring),
      supervised: Boolean(z.supervised),
      serial: z.serial ?? '',
      status: z.status ?? 'active',
      roomId: z.roomId ?? null,
      openingId: z.openingId ?? null,
    })),
  });
  return { ...result, caution: coverageCaution(result) };
}
