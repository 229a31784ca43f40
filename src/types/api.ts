/** Shapes of the API's responses, as the client reads them. */
import type { AppRule } from '@domain/abilities';
import type { Role } from '@domain/roles';
import type { TenantState } from '@domain/tenant-states';

export interface ApiUser {
  id: string;
  tenantId: string | null;
  email: string;
  name: string;
  role: Role;
  active: boolean;
  deactivatedAt: string | null;
  lastSignInAt: string | null;
  createdAt: string;
}

export interface ApiFirm {
  id: string;
  name: string;
  shortName: string;
  accentColor: string;
  accentColorReadable: string;
  logoUrl: string | null;
  phone?: string;
  monitoringCenterName: string;
  monitoringCenterPhone: string;
  timeZone: string;
  licenceNumber?: string;
  state?: TenantState;
  planKey?: string | null;
  trialEndsAt?: string | null;
  trialDaysLeft?: number | null;
  /** staff only: why the firm may read but not write right now (trial over, past due, cancelled), or null */
  readOnly?: { code: string; message: string } | null;
  createdAt?: string;
}

export interface SessionInfo {
  user: ApiUser | null;
  tenant: ApiFirm | null;
  rules: AppRule[];
  csrfToken: string;
}

export interface Page {
  number: number;
  size: number;
  total: number;
}

export interface ListResponse<T> {
  data: T[];
  page: Page;
}

export interface ApiInvitation {
  id: string;
  email: string;
  role: Role;
  state: 'pending' | 'expired' | 'accepted' | 'revoked';
  expiresAt: string;
  sentAt: string | null;
  createdAt: string;
}

/** A firm's public portal branding (GET /api/public/firms/:shortName). */
export interface PublicFirm {
  name: string;
  shortName: string;
  accentColor: string;
  accentColorReadable: string;
  logoUrl: string | null;
  phone: string;
  monitoringCenterPhone: string;
}

export interface InvitationPreview {
  firm: PublicFirm;
  email: string;
  role: Role;
  roleLabel: string;
  expiresAt: string;
  /** the address already has a Mullion sign-in, so it cannot accept (one address, one sign-in) */
  hasSignIn: boolean;
  /** what the invitee reads instead of the form when hasSignIn */
  notice?: string;
}

/** A sign-up waiting for its address to be confirmed (GET /api/signups/:token). */
export interface SignUpPreview {
  firmName: string;
  name: string;
  email: string;
  expiresAt: string;
}

export interface OperatorTenant {
  id: string;
  name: string;
  shortName: string;
  state: TenantState;
  planKey: string | null;
  staffCount: number;
  trialEndsAt: string | null;
  suspendedAt: string | null;
  suspendedReason: string | null;
  createdAt: string;
}

export interface OperatorTenantDetail extends OperatorTenant {
  owner: { name: string; email: string } | null;
  billing: OperatorTenantBilling;
  actions: { id: string; action: string; at: string; by: string; reason: string | null }[];
}

export interface ApiClient {
  id: string;
  name: string;
  email: string;
  phone: string;
  altPhone: string;
  notes?: string;
  status: 'active' | 'cancelled';
  siteCount?: number;
  createdAt: string;
}

export interface ApiAddress {
  line1: string;
  line2: string;
  city: string;
  region: string;
  postalCode: string;
  country: string;
}

export interface ApiSite {
  id: string;
  clientId: string;
  clientName?: string;
  name: string;
  address: ApiAddress;
  timeZone: string;
  latitude: number | null;
  longitude: number | null;
  monitoringAccount?: string;
  accessNotes?: string;
  permit: { number: string; authority: string; expiresOn: string | null };
  contract?: { startsOn: string | null; termMonths: number | null; monthlyFeeCents: number | null; cancelledOn: string | null; cancelReason: string };
  hasPasscode: boolean;
  createdAt: string;
}

export interface ApiContact {
  id: string;
  siteId: string;
  position: number;
  name: string;
  relation: string;
  phone: string;
  altPhone: string;
}

/** A contact as a change recorded it; the array order is the calling order. */
export type ApiContactSnapshot = Pick<ApiContact, 'name' | 'relation' | 'phone' | 'altPhone'>;

/** One change to a site's emergency contacts (staff history). */
export interface ApiContactChange {
  id: string;
  at: string;
  action: string;
  /** null when the person is no longer known to the firm */
  actor: { name: string; role: string } | null;
  /** made by the household in the portal: staff confirm it with the monitoring center */
  byHousehold: boolean;
  before: ApiContactSnapshot[] | null;
  after: ApiContactSnapshot[] | null;
  summary: string;
}

export interface ApiDocument {
  id: string;
  siteId: string;
  kind: 'permit' | 'contract' | 'certificate' | 'photo' | 'floor_plan' | 'other';
  title: string;
  contentType: string;
  sizeBytes: number;
  originalName: string;
  sharedWithClient: boolean;
  createdAt: string;
}

// ---------------------------------------------------------------------------------------------
// Panels and zones
// ---------------------------------------------------------------------------------------------
import type { PanelSettings } from '@domain/cp01';
import type { DeviceLifeState, EndOfLifeBasis } from '@domain/device-life';
import type { CommPath, DeviceType, ZoneStatus, ZoneType } from '@domain/devices';
import type { PanelOccupancy, StandbyDuty } from '@domain/panel-power';
import type { Evidence, Severity } from '@domain/severity';

/** One finding on a panel: CP-01 (settings, and the zone types of fire and CO devices) or power (standby battery, path). */
export interface ApiPanelFinding {
  code: string;
  severity: Severity;
  field: string | null;
  clause: string;
  evidence: Evidence;
  message: string;
  topic: 'cp01' | 'power';
  lifeSafety: boolean;
}

/** The panel's standby battery worked out from its currents (null amounts until the currents are recorded). */
export interface ApiPanelStandby {
  duty: StandbyDuty;
  standbyHours: number;
  alarmMinutes: number;
  neededAh: number | null;
  requiredAh: number | null;
  batteryDueOn: string | null;
}

/** What keeps a smoke, heat or CO device's zone from protecting, and what to change. */
export interface ApiLifeSafetyProblem {
  code: string;
  field: 'zoneType' | 'reportsToMonitoring' | 'supervised' | null;
  what: string;
  fix: string;
}

export interface ApiDeviceLife {
  batteryDueOn: string | null;
  endOfLifeOn: string | null;
  endOfLifeBasis?: EndOfLifeBasis;
  state: DeviceLifeState;
  batteryYears?: number | null;
  batteryUnderOneYear?: boolean;
}

export interface ApiPanel {
  id: string;
  siteId: string;
  /** The site's name, when the server sends it with the panel. */
  siteName?: string;
  label: string;
  makeModel: string;
  zoneCapacity: number;
  wirelessZoneFrom: number;
  wirelessZoneTo: number;
  commPath: CommPath;
  installedOn: string | null;
  occupancy?: PanelOccupancy;
  standbyCurrentMa?: number | null;
  alarmCurrentMa?: number | null;
  batteryAh?: number | null;
  batteryManufacturedOn?: string | null;
  pathFailureReportMin?: number | null;
  standby?: ApiPanelStandby;
  settings: PanelSettings;
  programmedAt: string | null;
  changedSinceProgrammed: boolean;
  /** Lowest free number in the wireless range; null when the range is full. */
  nextZoneNumber: number | null;
  /** Zones that hold a number (every zone but a removed one), when the server counts them. */
  zoneCount?: number;
  /** Every finding on the panel, most severe first: CP-01, life-safety zone types, standby battery, path. */
  audit: ApiPanelFinding[];
  createdAt?: string;
  updatedAt?: string;
}

export interface ApiZone {
  id: string;
  panelId: string;
  number: number;
  description: string;
  deviceType: DeviceType;
  zoneType: ZoneType;
  serial: string;
  input: number;
  reportsToMonitoring: boolean;
  chime: boolean;
  supervised: boolean;
  status: ZoneStatus;
  roomId: string | null;
  openingId: string | null;
  installedOn: string | null;
  batteryType: string | null;
  batteryChangedOn: string | null;
  manufacturedOn: string | null;
  life: ApiDeviceLife;
  /** How the zone keeps a smoke, heat or CO device from protecting (empty when it protects). */
  lifeSafetyProblems?: ApiLifeSafetyProblem[];
  /** The same serial in service on other panels of the firm (a note, not an error). */
  elsewhere?: (ApiSerialElsewhere | string)[];
  /** Notes that did not block saving, e.g. a number outside the wireless range. */
  warnings?: ApiFieldNote[];
  createdAt?: string;
  updatedAt?: string;
}

export interface ApiSerialElsewhere {
  zoneId: string;
  panelId: string;
  siteId: string;
  panelLabel: string;
  siteName: string;
  number: number;
  note: string;
}

export interface ApiFieldNote {
  code: string;
  field: string | null;
  message: string;
}

/** One changed field of a change-log entry or an import row. */
export interface ApiFieldChange {
  field: string;
  from: unknown;
  to: unknown;
}

/**
 * One entry of a panel's change log. Zone changes carry zone fields; panel settings changes
 * carry `settings.<key>` fields and no zone. The changes come as a list of { field, from, to }
 * (or, from older servers, an object of [old, new] pairs), the time as `at` (or `createdAt`).
 */
export interface ApiZoneChange {
  id: string;
  zoneId: string | null;
  zoneNumber: number | null;
  action: 'created' | 'updated' | 'removed' | 'deleted' | 'imported' | 'programmed';
  changes: ApiFieldChange[] | Record<string, [unknown, unknown]>;
  actorName: string;
  at?: string;
  createdAt?: string;
}

/** One row of an import's dry run: what the file says and what Mullion will do with it. */
export interface ApiZoneImportRow extends Partial<Omit<ApiZone, 'life' | 'warnings'>> {
  row: number;
  action: 'create' | 'update' | 'unchanged';
  zoneId: string | null;
  changes?: ApiFieldChange[];
  warnings?: ApiFieldNote[];
}

/** The answer of POST /api/panels/:panelId/zones/import: rows only on a dry run. */
export interface ApiZoneImportResult {
  dryRun?: boolean;
  rows?: ApiZoneImportRow[];
  creates: number;
  updates: number;
  unchanged?: number;
}

// ---------------------------------------------------------------------------------------------
// Premises and coverage
// ---------------------------------------------------------------------------------------------
import type { FindingSeverity } from '@domain/coverage';
import type { OpeningKind, RoomKind } from '@domain/premises';

export interface ApiOpening {
  id: string;
  roomId: string;
  kind: OpeningKind;
  label: string;
  groundReachable: boolean;
}

export interface ApiRoom {
  id: string;
  floorId: string;
  name: string;
  kind: RoomKind;
  fuelBurningAppliance: boolean;
  attachedGarage: boolean;
  /** a bedroom: the hall or landing that serves its sleeping area */
  servedByHallId?: string | null;
  /** a bedroom: its door confirmed within 21 ft of that hall's alarm */
  hallWithin21FtConfirmed?: boolean;
  /** a bathroom: the bedroom it is attached to */
  attachedToBedroomId?: string | null;
  openings: ApiOpening[];
}

export interface ApiFloor {
  id: string;
  siteId: string;
  name: string;
  level: number;
  belowGrade: boolean;
  planImageId: string | null;
  /** Where the plan image is served (GET /api/floors/:floorId/plan), or null without one. */
  planImageUrl: string | null;
  rooms: ApiRoom[];
}

/** What the premises answer tells of each zone of the site: enough to link it and pin it. */
export interface ApiPremisesZone {
  id: string;
  panelId: string;
  panelLabel: string;
  number: number;
  description: string;
  deviceType: DeviceType;
  status: ZoneStatus;
  roomId: string | null;
  openingId: string | null;
  pin: ApiZonePin | null;
}

/**
 * GET /api/sites/:siteId/premises: the site's floors, each with its rooms and their openings,
 * and (when the server sends them) the site's zones with their links and pins.
 */
export interface ApiPremises {
  floors: ApiFloor[];
  zones?: ApiPremisesZone[];
}

/** A zone's place on a floor plan: x and y as fractions (0..1) of the image's width and height. */
export interface ApiZonePin {
  floorId: string;
  x: number;
  y: number;
}

/** Zones carry their pin (declaration merging: the zone's other fields are above). */
export interface ApiZone {
  pin?: ApiZonePin | null;
}

export interface ApiCoverageFinding {
  code: string;
  severity: FindingSeverity;
  /** the rule in words */
  rule: string;
  /** where the rule comes from (staff only) */
  source?: string;
  /** public text, memory or trade practice (staff only) */
  evidence?: Evidence;
  message: string;
  floorId: string | null;
  roomId: string | null;
  zoneId?: string | null;
  /** smoke/CO findings; shown with the life-safety caution */
  lifeSafety?: boolean;
}

export interface ApiCoverageOpening {
  id: string;
  kind: OpeningKind;
  label: string;
  groundReachable?: boolean;
  protected: boolean;
  zoneDescription: string | null;
}

export interface ApiCoverageRoom {
  id: string;
  name: string;
  kind?: RoomKind;
  openings: ApiCoverageOpening[];
  /** `counts` is false for a smoke, heat or CO device whose zone is not programmed to protect */
  devices?: { zoneId: string; description: string; deviceType: DeviceType; counts?: boolean }[];
}

export interface ApiCoverageFloor {
  id: string;
  name: string;
  level?: number;
  belowGrade?: boolean;
  rooms: ApiCoverageRoom[];
}

/** GET /api/sites/:siteId/coverage */
export interface ApiCoverage {
  openings: { total: number; protected: number; unprotectedGroundReachable: number };
  /** "14 of 17 openings protected; 2 windows reachable from the ground have no sensor" */
  summary: string;
  findings: ApiCoverageFinding[];
  /** the life-safety caution, present when a life-safety finding is reported */
  caution?: string | null;
  floors: ApiCoverageFloor[];
}

// ---------------------------------------------------------------------------------------------
// Jobs
// ---------------------------------------------------------------------------------------------
import type { JobKind, JobState, WalkTestResult } from '@domain/jobs';

export interface ApiJobPart {
  description: string;
  quantity: number;
  unitPriceCents: number;
}

export interface ApiChecklistItem {
  label: string;
  done: boolean;
}

/** One recorded walk-test result of a job (the zones the job touched come first). */
export interface ApiWalkTestRow {
  zoneId: string;
  result: WalkTestResult;
  monitoringConfirmed: boolean;
  note: string;
  panelId?: string | null;
  zoneNumber?: number | null;
  zoneDescription?: string;
  touched?: boolean;
  recordedById?: string | null;
  recordedAt?: string;
}

/** A photo or file of a job: a document record with its thumbnail when it is an image. */
export interface ApiJobFile extends ApiDocument {
  jobId: string | null;
  thumbnailUrl?: string | null;
  fileUrl?: string;
}

export interface ApiJob {
  id: string;
  siteId: string;
  siteName: string;
  /** the site's time zone, when the server sends it with the job */
  siteTimeZone?: string;
  kind: JobKind;
  state: JobState;
  scheduledStart: string | null;
  scheduledEnd: string | null;
  technicianId: string | null;
  technicianName: string | null;
  summary: string;
  clientNotes: string;
  /** staff only */
  internalNotes?: string;
  parts: ApiJobPart[];
  checklist: ApiChecklistItem[];
  touchedZoneIds: string[];
  cancelReason: string;
  requestedByClient?: boolean;
  startedAt?: string | null;
  completedAt: string | null;
  completedById?: string | null;
  /** the completion report (PDF), once completed */
  reportUrl?: string | null;
  walkTest: ApiWalkTestRow[];
  files: ApiJobFile[];
  /** other open jobs of the same technician at the same time (staff only) */
  overlaps?: string[];
  createdAt?: string;
  updatedAt?: string;
}

export type ApiHistoryType = 'job' | 'zone_change' | 'programming';

/** One entry of a site's service history (GET /api/sites/:siteId/history), newest first. */
export interface ApiHistoryEntry {
  type: ApiHistoryType;
  at: string;
  title: string;
  detail: string;
  link: { kind: 'job' | 'zone' | 'panel'; id: string };
}

// ---- Client portal (client-audience presenters under /api/portal) ----

export interface PortalFirmContact {
  name: string;
  phone: string;
  monitoringCenterName: string;
  monitoringCenterPhone: string;
}

export interface PortalSite {
  id: string;
  name: string;
  address: { line1: string; line2: string; city: string; region: string; postalCode: string; country: string };
  timeZone: string;
  firm: PortalFirmContact;
}

export interface PortalDeviceLife {
  state: DeviceLifeState;
  batteryDueOn: string | null;
  endOfLifeOn: string | null;
  endOfLifeBasis?: EndOfLifeBasis;
}

export interface PortalDevice {
  id: string;
  description: string;
  kind: string;
  whenArmed: string;
  chime: boolean;
  /** a smoke, heat or CO device: shown with the caution */
  lifeSafety?: boolean;
  /** false for a smoke, heat or CO device whose zone is not programmed to protect */
  protects?: boolean;
  life: PortalDeviceLife;
}

export interface PortalSiteSummary {
  site: PortalSite;
  coverage: { openings: ApiCoverage['openings']; summary: string };
  lifeSafety: { findings: { code: string; severity: 'error' | 'warning' | 'info'; message: string }[]; caution: string | null };
  devicesDueSoon: PortalDevice[];
  nextVisit: { kind: string; scheduledStart: string | null } | null;
  firm: PortalFirmContact;
}

export interface PortalPlan {
  floorId: string;
  imageUrl: string;
  pins: { zoneId: string; number: number; description: string; kind: string; x: number; y: number }[];
}

export interface PortalCoverage extends ApiCoverage {
  plans: PortalPlan[];
}

export interface PortalUpcomingVisit {
  id: string;
  kind: string;
  kindLabel: string;
  state: 'requested' | 'scheduled' | 'in_progress' | 'completed' | 'cancelled';
  scheduledStart: string | null;
  technicianFirstName: string | null;
  summary: string;
  requestedByClient: boolean;
}

export interface PortalPastVisit {
  id: string;
  kind: string;
  kindLabel: string;
  state: 'completed' | 'cancelled';
  completedAt: string | null;
  scheduledStart: string | null;
  summary: string;
  clientNotes: string;
  files: { id: string; title: string; contentType: string; fileUrl: string }[];
  reportUrl: string | null;
}

export interface PortalService {
  upcoming: PortalUpcomingVisit[];
  past: PortalPastVisit[];
}

export interface PortalDocument {
  id: string;
  kind: string;
  kindLabel: string;
  title: string;
  contentType: string;
  sizeBytes: number;
  createdAt: string;
  visit: { kindLabel: string; on: string | null } | null;
  fileUrl: string;
}

/** GET /api/operator/revenue: the service's MRR and firms, for the operator. */
export interface OperatorRevenue {
  mrrCents: number;
  /** firms whose subscription counts in MRR now (active or past due) */
  activeSubscriptions: number;
  firmsByState: Record<TenantState, number>;
  trialsEndingThisWeek: { id: string; name: string; trialEndsAt: string }[];
  /** the last 12 calendar months, oldest first */
  series: { month: string; label: string; mrrCents: number }[];
}

/** A firm's plan and its usage against the plan's limits (operator firm page). */
export interface OperatorTenantBilling {
  planKey: string | null;
  planName: string | null;
  monthlyPriceCents: number | null;
  usage: { activeSites: number; staffSeats: number };
  limits: { activeSites: number; staffSeats: number; onTrial: boolean };
}

/** GET /api/firm/business: the firm's own numbers from its monitoring contracts. */
export interface FirmBusiness {
  /** the firm's today, 'YYYY-MM-DD' */
  today: string;
  rmrCents: number;
  activeContracts: number;
  newContracts12m: number;
  cancelledContracts12m: number;
  attrition: {
    periodStart: string;
    periodEnd: string;
    cancelled: number;
    activeAtStart: number;
    activeAtEnd: number;
    averageActive: number;
    /** a fraction (0.25 is 25 %); null when nothing was in force */
    rate: number | null;
  };
  /** renewals due within 90 days, soonest first */
  renewals: { siteId: string; siteName: string; clientId: string; clientName: string; renewsOn: string; monthlyFeeCents: number | null }[];
  series: { month: string; label: string; rmrCents: number; activeContracts: number }[];
}

/** GET /api/billing (owners only): the firm's plan, state, dates, usage against limits and the catalogue. */
export interface ApiBilling {
  state: TenantState;
  stateLabel: string;
  planKey: string | null;
  plan: { key: string; name: string; monthlyPriceCents: number; staffSeats: number; activeSites: number } | null;
  trialEndsAt: string | null;
  trialDaysLeft: number | null;
  pastDueSince: string | null;
  graceEndsAt: string | null;
  currentPeriodEnd: string | null;
  cancelAtPeriodEnd: boolean;
  readOnly: { code: 'trial_ended' | 'past_due' | 'cancelled'; message: string } | null;
  usage: { activeSites: number; staffSeats: number };
  /** the plan's limits, or the largest plan's while on trial (`onTrial`) */
  limits: { activeSites: number; staffSeats: number; onTrial: boolean };
  /** a subscription Stripe still bills: changes go through the billing portal, not Checkout */
  hasSubscription: boolean;
  paymentsConfigured: boolean;
  plans: { key: string; name: string; monthlyPriceCents: number; staffSeats: number; activeSites: number; pitch: string }[];
}

/** GET /api/billing/invoices: the firm's invoices as Stripe keeps them, newest first. */
export interface ApiInvoice {
  id: string;
  number: string | null;
  /** Stripe's word: draft, open, paid, uncollectible, void */
  status: string | null;
  amountDueCents: number;
  amountPaidCents: number;
  currency: string;
  createdAt: string;
  periodStart: string | null;
  periodEnd: string | null;
  hostedInvoiceUrl: string | null;
  pdfUrl: string | null;
}
