/**
 * The invented installed base of a demo firm: a dozen clients, their sites (fictional
 * towns of a fictional county), emergency contacts, one panel per site and a realistic
 * set of zones — some batteries due, some smoke alarms near end of life, and one panel
 * whose settings fall outside CP-01. Each life-safety mistake the rules look for appears
 * on one site (see LIFE_SAFETY_SCENES). Deterministic: the same firm gets the same data.
 */
import type { Transaction } from 'sequelize';
import { CP01_DEFAULTS } from '@domain/cp01';
import { isLifeSafetyDevice, type DeviceType } from '@domain/devices';
import type { PanelSettings } from '@domain/schemas/panel';
import { zoneDefaultsFor, type ZoneDefaults } from '@domain/zones';
import type { SecretBox } from '../../crypto/secret-box';
import { Client } from '../../models/Client';
import { EmergencyContact } from '../../models/EmergencyContact';
import { Panel } from '../../models/Panel';
import { Site } from '../../models/Site';
import { Zone } from '../../models/Zone';
import type { TenantFiles } from '../../storage/tenant-files';
import { seedJobs } from './demo-jobs';
import { LIFE_SAFETY_SCENES } from './demo-life-safety-scenes';
import { seedPremises } from './demo-premises';

const FIRST = ['Maren', 'Joel', 'Ines', 'Tobias', 'Odile', 'Ravi', 'Hedda', 'Callum', 'Petra', 'Amos', 'Liesl', 'Dario', 'Wren', 'Soren', 'Yara', 'Bram'];
const LAST = ['Osk', 'Fairweather', 'Lindqvist', 'Marrow', 'Achterberg', 'Quill', 'Trevane', 'Holloway', 'Sandor', 'Blackwood', 'Renner', 'Pike', 'Ashdown', 'Kell'];
const STREETS = ['Elm Hollow Road', 'Quarry Lane', 'Millrace Street', 'Sedge Court', 'Harrow Way', 'Lantern Row', 'Copper Beech Drive', 'Tannery Close', 'Weir Street', 'Orchard Rise'];
const TOWNS = ['Lanternfield', 'Harrowgate Mill', 'Sedgebrook', 'Cobble Ferry', 'Tamsworth Vale', 'Ashby Cross'];
const RELATIONS = ['Neighbour', 'Daughter', 'Son', 'Sister', 'Brother', 'Friend', 'Key holder'];

/** A small deterministic random source (linear congruential), so demo data repeats exactly. */
function randomFrom(seed: number) {
  let state = seed >>> 0 || 1;
  const next = () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
  return {
    next,
    int: (min: number, max: number) => min + Math.floor(next() * (max - min + 1)),
    pick: <T>(items: readonly T[]): T => items[Math.floor(next() * items.length)]!,
  };
}

function isoDaysAgo(today: Date, days: number): string {
  const d = new Date(Date.UTC(today.getUTCFullYear(), today.getUTCMonth(), today.getUTCDate()));
  d.setUTCDate(d.getUTCDate() - days);
  return d.toISOString().slice(0, 10);
}

interface ZonePlan {
  description: string;
  deviceType: DeviceType;
  batteryType: string | null;
  /** Behaviour fields that differ from the device type's defaults (a programming mistake) */
  behaviour?: Partial<ZoneDefaults>;
}

const HOME_ZONES: ZonePlan[] = [
  { description: 'Front door', deviceType: 'door_contact', batteryType: 'CR2032' },
  { description: 'Back door', deviceType: 'door_contact', batteryType: 'CR2032' },
  { description: 'Garage door', deviceType: 'garage_door_tilt', batteryType: 'CR123A' },
  { description: 'Patio slider', deviceType: 'sliding_door_contact', batteryType: 'CR2032' },
  { description: 'Living room window', deviceType: 'window_contact', batteryType: 'CR2032' },
  { description: 'Kitchen window', deviceType: 'window_contact', batteryType: 'CR2032' },
  { description: 'Den window', deviceType: 'window_contact', batteryType: 'CR2032' },
  { description: 'Hallway motion', deviceType: 'motion', batteryType: 'CR123A' },
  { description: 'Living room glass', deviceType: 'glass_break', batteryType: 'CR123A' },
  { description: 'Upstairs hall smoke', deviceType: 'smoke', batteryType: 'sealed 10-year' },
  { description: 'Main bedroom smoke', deviceType: 'smoke', batteryType: 'sealed 10-year' },
  { description: 'Hallway CO', deviceType: 'co', batteryType: 'sealed 10-year' },
  { description: 'Basement water', deviceType: 'water', batteryType: 'CR2450' },
  { description: 'Bedside panic', deviceType: 'panic_button', batteryType: 'CR2032' },
  { description: 'Keyfob 1', deviceType: 'keyfob', batteryType: 'CR2032' },
];


/** The zones of one site, with the life-safety scene of that site applied. */
function sceneZones(plan: ZonePlan[], scene: number): ZonePlan[] {
  const zones = plan.map((z) => ({ ...z }));
  const byName = (name: string) => zones.find((z) => z.description === name);
  if (scene === LIFE_SAFETY_SCENES.smokeOnChimeZone) {
    // enrolled as a chime zone, not reported: the panel never treats it as a fire
    const smoke = byName('Main bedroom smoke');
    if (smoke) smoke.behaviour = { zoneType: 'monitor_only', reportsToMonitoring: false };
  }
  if (scene === LIFE_SAFETY_SCENES.garageSmoke) zones.push({ description: 'Garage smoke', deviceType: 'smoke', batteryType: 'sealed 10-year' });
  if (scene === LIFE_SAFETY_SCENES.coinCellSmoke) {
    const smoke = byName('Main bedroom smoke');
    if (smoke) smoke.batteryType = 'CR2032';
  }
  if (scene === LIFE_SAFETY_SCENES.halfEnrolledCombination) {
    const smoke = byName('Upstairs hall smoke');
    if (smoke) Object.assign(smoke, { description: 'Landing smoke and CO', deviceType: 'smoke_co' as const });
  }
  return zones;
}

export interface SeededInstalledBase {
  clients: number;
  sites: number;
  zones: number;
  /** the first household: its site has the drawn floor plan, so the portal demo shows it */
  firstClient: { id: string; name: string; email: string } | null;
}

export async function seedInstalledBase(
  tenantId: string,
  options: {
    seed: number;
    today: Date;
    timeZone: string;
    region: string;
    secrets: SecretBox;
    files: TenantFiles;
    transaction: Transaction;
    cp01FindingOnFirstPanel: boolean;
    technicianIds: readonly string[];
    coordinatorId: string | null;
  },
): Promise<SeededInstalledBase> {
  const rnd = randomFrom(options.seed);
  const { transaction, today } = options;
  let zoneCount = 0;
  let siteCount = 0;
  let firstClient: { id: string; name: string; email: string } | null = null;
  const clientCount = 12;
  for (let c = 0; c < clientCount; c++) {
    const last = LAST[(c + options.seed) % LAST.length]!;
    const first = FIRST[(c * 3 + options.seed) % FIRST.length]!;
    const partner = FIRST[(c * 5 + 7 + options.seed) % FIRST.length]!;
    const household = c % 3 === 0 ? `${first} and ${partner} ${last}` : `${first} ${last}`;
    const localPart = `${first}.${last}`.toLowerCase().replace(/[^a-z.]/g, '');
    const client = await Client.create(
      {
        tenantId,
        name: household,
        email: `${localPart}@homes.example`,
        phone: `+1555010${String(1000 + ((c * 37 + options.seed) % 9000)).slice(-4)}`.slice(0, 12),
        notes: c === 1 ? 'Prefers visits after 3 pm. Dog in the yard.' : '',
        status: c === 11 ? 'cancelled' : 'active',
      },
      { transaction },
    );
    firstClient ??= { id: client.id, name: client.name, email: client.email };
    const sitesForClient = c === 4 ? 2 : 1;
    for (let s = 0; s < sitesForClient; s++) {
      siteCount++;
      const town = rnd.pick(TOWNS);
      const startedDaysAgo = rnd.int(200, 2400);
      const site = await Site.create(
        {
          tenantId,
          clientId: client.id,
          name: s === 0 ? 'Home' : 'Lake cabin',
          addressLine1: `${rnd.int(3, 980)} ${rnd.pick(STREETS)}`,
          city: town,
          region: options.region,
          postalCode: `0${rnd.int(1000, 9999)}`,
          country: 'US',
          timeZone: options.timeZone,
          latitude: Math.round((41 + rnd.next()) * 1e5) / 1e5,
          longitude: Math.round((-88 - rnd.next()) * 1e5) / 1e5,
          monitoringAccount: String(rnd.int(100000, 999999)),
          passcodeCipher: options.secrets.seal(rnd.pick(['bluefinch', 'harbor7', 'lanternlight', 'oak-42', 'millpond'])),
          accessNotes: s === 0 && c % 4 === 0 ? 'Key safe by the side gate, code given on booking.' : '',
          permitNumber: c % 5 === 3 ? '' : `BC-${rnd.int(10000, 99999)}`,
          permitAuthority: c % 5 === 3 ? '' : 'Brindle County Sheriff',
          permitExpiresOn: c % 5 === 3 ? null : isoDaysAgo(today, rnd.int(-330, 40)),
          contractStartsOn: isoDaysAgo(today, startedDaysAgo),
          contractTermMonths: rnd.pick([12, 24, 36, 60]),
          contractMonthlyFeeCents: rnd.pick([2999, 3499, 3999, 4499, 5499]),
          contractCancelledOn: c === 11 ? isoDaysAgo(today, 20) : null,
          contractCancelReason: c === 11 ? 'Moved out of the area' : '',
        },
        { transaction },
      );
      for (let p = 1; p <= 2; p++) {
        await EmergencyContact.create(
          {
            tenantId,
            siteId: site.id,
            position: p,
            name: `${rnd.pick(FIRST)} ${rnd.pick(LAST)}`,
            relation: rnd.pick(RELATIONS),
            phone: `+1555010${String(rnd.int(1000, 9999))}`,
          },
          { transaction },
        );
      }
      const installedDaysAgo = rnd.int(400, 3600);
      const installedOn = isoDaysAgo(today, installedDaysAgo);
      const withFinding = options.cp01FindingOnFirstPanel && siteCount === 1;
      const settings: PanelSettings = withFinding ? { ...CP01_DEFAULTS, exitDelaySec: 30, entryDelaySec: 45 } : { ...CP01_DEFAULTS };
      const scene = siteCount;
      const pickedPath = rnd.pick(['cellular', 'combination', 'ip'] as const);
      const commPath =
        scene === LIFE_SAFETY_SCENES.phoneLineOnly ? 'phone_line' : scene === LIFE_SAFETY_SCENES.slowPathSupervision && pickedPath === 'combination' ? 'cellular' : pickedPath;
      const powerKnown = scene !== LIFE_SAFETY_SCENES.powerUnknown;
      const panel = await Panel.create(
        {
          tenantId,
          siteId: site.id,
          label: 'Main panel',
          makeModel: rnd.pick(['Wireless hub, series 4', 'Hybrid panel, series 2', 'Touchscreen hub, series 7']),
          zoneCapacity: 64,
          wirelessZoneFrom: 9,
          wirelessZoneTo: 64,
          commPath,
          occupancy: 'household',
          // A typical wireless hub: 120 mA standby, 900 mA with its siren sounding. 120 × 24 h +
          // 900 × 4 min ÷ 60 needs 2.94 Ah, 3.53 Ah with headroom: a 7 Ah battery passes and the
          // 2.3 Ah one on the standby-short site does not.
          standbyCurrentMa: powerKnown ? 120 : null,
          alarmCurrentMa: powerKnown ? 900 : null,
          batteryAh: powerKnown ? (scene === LIFE_SAFETY_SCENES.standbyShort ? 2.3 : 7) : null,
          batteryManufacturedOn: powerKnown ? isoDaysAgo(today, scene === LIFE_SAFETY_SCENES.standbyOld ? 2300 : rnd.int(100, 1200)) : null,
          pathFailureReportMin: !powerKnown || commPath === 'combination' || commPath === 'phone_line' ? null : scene === LIFE_SAFETY_SCENES.slowPathSupervision ? 60 : 5,
          installedOn,
          settings,
          programmedAt: new Date(today.getTime() - rnd.int(5, 300) * 86_400_000),
          changedSinceProgrammed: siteCount % 4 === 2,
        },
        { transaction },
      );
      // The smoke and CO alarms are always there: the life-safety scenes build on them.
      const plan = sceneZones(
        HOME_ZONES.filter((z, i) => i < 9 || isLifeSafetyDevice(z.deviceType) || rnd.next() > 0.25),
        scene,
      );
      let number = 9;
      const zonesByDescription = new Map<string, Zone>();
      for (const z of plan) {
        const defaults = { ...zoneDefaultsFor(z.deviceType), ...z.behaviour };
        const lifeSafety = isLifeSafetyDevice(z.deviceType);
        // Some old smoke/CO alarms (end of life due or soon) and some tired coin cells.
        const labelMissing = lifeSafety && (scene === LIFE_SAFETY_SCENES.labelDateMissing || scene === LIFE_SAFETY_SCENES.labelDateMissingOld);
        const manufacturedDaysAgo = lifeSafety && !labelMissing ? rnd.int(700, 3900) : null;
        // an alarm fitted in a house long ago whose label date nobody wrote down
        const zoneInstalledOn = scene === LIFE_SAFETY_SCENES.labelDateMissingOld && lifeSafety ? isoDaysAgo(today, 4200) : installedOn;
        const batteryChangedDaysAgo = !lifeSafety && rnd.next() > 0.5 ? rnd.int(200, 2000) : null;
        const serialDigits = String(rnd.int(1, 9_999_999)).padStart(7, '0');
        const zone = await Zone.create(
          {
            tenantId,
            siteId: site.id,
            panelId: panel.id,
            number: number++,
            description: z.description,
            deviceType: z.deviceType,
            ...defaults,
            serial: serialDigits,
            input: 1,
            status: rnd.next() > 0.96 && !lifeSafety ? 'bypassed' : 'active',
            installedOn: zoneInstalledOn,
            batteryType: z.batteryType,
            batteryChangedOn: batteryChangedDaysAgo === null ? null : isoDaysAgo(today, batteryChangedDaysAgo),
            manufacturedOn: manufacturedDaysAgo === null ? null : isoDaysAgo(today, manufacturedDaysAgo),
          },
          { transaction },
        );
        zonesByDescription.set(z.description, zone);
        zoneCount++;
      }
      await seedPremises(site, zonesByDescription, { transaction, files: options.files, withPlan: siteCount === 1, scene });
      await seedJobs(site, [...zonesByDescription.values()], {
        transaction,
        files: options.files,
        today,
        installedOn,
        technicianIds: options.technicianIds,
        siteIndex: siteCount - 1,
        coordinatorId: options.coordinatorId,
      });
    }
  }
  return { clients: clientCount, sites: siteCount, zones: zoneCount, firstClient };
}
