/** Invented panels and zones for the client tests of the panel page, zone form and import. */
import { CP01_DEFAULTS } from '@domain/cp01';
import { defineRulesFor } from '@domain/abilities';
import type { ApiPanel, ApiZone, SessionInfo } from '@/types/api';

export const technicianSession: SessionInfo = {
  user: { id: 'u1', tenantId: 't1', email: 'wren@lanternfield.example', name: 'Wren Aldous', role: 'technician', active: true, deactivatedAt: null, lastSignInAt: null, createdAt: '2026-01-01T00:00:00Z' },
  tenant: { id: 't1', name: 'Lanternfield Alarm Co.', shortName: 'lanternfield', accentColor: '#8f5c17', accentColorReadable: '#8f5c17', logoUrl: null, monitoringCenterName: 'Ridgeway Monitoring', monitoringCenterPhone: '+1 555 010 4400', timeZone: 'America/Chicago', state: 'active' },
  rules: defineRulesFor({ id: 'u1', role: 'technician', tenantId: 't1' }),
  csrfToken: 'token-1',
};

export function makePanel(overrides: Partial<ApiPanel> = {}): ApiPanel {
  return {
    id: 'p1',
    siteId: 's1',
    label: 'Main panel',
    makeModel: 'Harrow 64W',
    zoneCapacity: 64,
    wirelessZoneFrom: 9,
    wirelessZoneTo: 64,
    commPath: 'cellular',
    installedOn: '2025-03-14',
    settings: { ...CP01_DEFAULTS },
    programmedAt: '2026-02-01T15:00:00.000Z',
    changedSinceProgrammed: false,
    nextZoneNumber: 12,
    zoneCount: 3,
    audit: [],
    ...overrides,
  };
}

export function makeZone(overrides: Partial<ApiZone> = {}): ApiZone {
  return {
    id: 'z1',
    panelId: 'p1',
    number: 9,
    description: 'Front door',
    deviceType: 'door_contact',
    zoneType: 'entry_exit',
    serial: '0412877',
    input: 1,
    reportsToMonitoring: true,
    chime: true,
    supervised: true,
    status: 'active',
    roomId: null,
    openingId: null,
    installedOn: '2025-03-14',
    batteryType: 'CR2032',
    batteryChangedOn: null,
    manufacturedOn: null,
    life: { batteryDueOn: '2030-04-20', endOfLifeOn: null, state: 'ok' },
    elsewhere: [],
    ...overrides,
  };
}
