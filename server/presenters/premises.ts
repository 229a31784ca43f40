import type { Floor } from '../models/Floor';
import type { Opening } from '../models/Opening';
import type { Panel } from '../models/Panel';
import type { Room } from '../models/Room';
import type { Zone } from '../models/Zone';
import type { SiteCoverage } from '../services/coverage';
import type { SitePremises } from '../services/premises';
import { pinOf } from './zone';

/** The address of a floor's plan image; `v` changes with the image so caches never show the old one. */
export function floorPlanUrl(floor: Pick<Floor, 'id' | 'planImageId'>): string | null {
  return floor.planImageId ? `/api/floors/${floor.id}/plan?v=${encodeURIComponent(floor.planImageId.slice(0, 8))}` : null;
}

/** A floor (api-resources.md, "Premises"). */
export function presentFloor(floor: Floor) {
  return {
    id: floor.id,
    siteId: floor.siteId,
    name: floor.name,
    level: floor.level,
    belowGrade: Boolean(floor.belowGrade),
    planImageId: floor.planImageId ?? null,
    planImageUrl: floorPlanUrl(floor),
    createdAt: floor.createdAt.toISOString(),
    updatedAt: floor.updatedAt.toISOString(),
  };
}

/** A room (api-resources.md, "Premises"). */
export function presentRoom(room: Room) {
  return {
    id: room.id,
    floorId: room.floorId,
    siteId: room.siteId,
    name: room.name,
    kind: room.kind,
    fuelBurningAppliance: Boolean(room.fuelBurningAppliance),
    attachedGarage: Boolean(room.attachedGarage),
    servedByHallId: room.servedByHallId ?? null,
    hallWithin21FtConfirmed: Boolean(room.hallWithin21FtConfirmed),
    attachedToBedroomId: room.attachedToBedroomId ?? null,
    createdAt: room.createdAt.toISOString(),
    updatedAt: room.updatedAt.toISOString(),
  };
}

/** An opening (api-resources.md, "Premises"). */
export function presentOpening(opening: Opening) {
  return {
    id: opening.id,
    roomId: opening.roomId,
    siteId: opening.siteId,
    kind: opening.kind,
    label: opening.label,
    groundReachable: Boolean(opening.groundReachable),
    createdAt: opening.createdAt.toISOString(),
    updatedAt: opening.updatedAt.toISOString(),
  };
}

/** What the premises page needs to know of a zone to link it and pin it (staff only). */
export function presentPremisesZone(zone: Zone, panel: Panel | undefined) {
  return {
    id: zone.id,
    panelId: zone.panelId,
    panelLabel: panel?.label ?? '',
    number: zone.number,
    description: zone.description,
    deviceType: zone.deviceType,
    status: zone.status ?? 'active',
    roomId: zone.roomId ?? null,
    openingId: zone.openingId ?? null,
    pin: pinOf(zone),
  };
}

/**
 * A site's whole premises in one answer: floors by level, each with its rooms, each with its
 * openings — plus (beyond api-resources.md) the site's zones with their links and pins, so
 * the premises page needs one request.
 */
export function presentPremises(premises: SitePremises) {
  const panelById = new Map(premises.panels.map((p) => [p.id, p]));
  return {
    floors: premises.floors.map((floor) => ({
      ...presentFloor(floor),
      rooms: premises.rooms
        .filter((room) => room.floorId === floor.id)
        .map((room) => ({
          ...presentRoom(room),
          openings: premises.openings.filter((o) => o.roomId === room.id).map(presentOpening),
        })),
    })),
    zones: premises.zones.map((zone) => presentPremisesZone(zone, panelById.get(zone.panelId))),
  };
}

/**
 * A site's coverage (api-resources.md, "Coverage"). Staff get each finding's rule, source and
 * evidence (public text, memory or trade practice). Households get the finding in plain words
 * and its rule, never the source notes or anything marked as known from memory.
 */
export function presentCoverage(coverage: SiteCoverage, options: { audience: 'staff' | 'client' } = { audience: 'staff' }) {
  const staff = options.audience === 'staff';
  return {
    openings: {
      total: coverage.openings.total,
      protected: coverage.openings.protected,
      unprotectedGroundReachable: coverage.openings.unprotectedGroundReachable,
    },
    summary: coverage.summary,
    findings: coverage.findings.map((f) => ({
      code: f.code,
      severity: f.severity,
      rule: f.rule,
      ...(staff ? { source: f.source, evidence: f.evidence } : {}),
      message: f.message,
      floorId: f.floorId,
      roomId: f.roomId,
      zoneId: f.zoneId,
      lifeSafety: f.lifeSafety,
    })),
    caution: coverage.caution,
    floors: coverage.floors.map((floor) => ({
      id: floor.id,
      name: floor.name,
      level: floor.level,
      belowGrade: floor.belowGrade,
      rooms: floor.rooms.map((room) => ({
        id: room.id,
        name: room.name,
        kind: room.kind,
        openings: room.openings.map((o) => ({
          id: o.id,
          kind: o.kind,
          label: o.label,
          groundReachable: o.groundReachable,
          protected: o.protected,
          zoneDescription: o.zoneDescription,
        })),
        devices: room.devices.map((d) => ({ zoneId: d.zoneId, description: d.description, deviceType: d.deviceType, counts: d.counts })),
      })),
    })),
  };
}
