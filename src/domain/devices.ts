/**
 * Device types, zone types and panel vocabulary (product.md, "The job, as the trade does
 * it"). Keys are fixed (API, CSV, database); labels are our own words for the UI.
 */
export const DEVICE_TYPES = [
  'door_contact',
  'window_contact',
  'sliding_door_contact',
  'garage_door_tilt',
  'motion',
  'glass_break',
  'smoke',
  'smoke_detector',
  'smoke_co',
  'heat',
  'co',
  'water',
  'temperature',
  'panic_button',
  'keyfob',
  'keypad',
  'siren',
  'other',
] as const;
export type DeviceType = (typeof DEVICE_TYPES)[number];

export const DEVICE_TYPE_LABELS: Record<DeviceType, string> = {
  door_contact: 'Door contact',
  window_contact: 'Window contact',
  sliding_door_contact: 'Sliding door contact',
  garage_door_tilt: 'Garage door tilt',
  motion: 'Motion detector',
  glass_break: 'Glass-break detector',
  smoke: 'Smoke alarm',
  smoke_detector: 'System smoke detector',
  smoke_co: 'Smoke and CO alarm (combination)',
  heat: 'Heat alarm',
  co: 'CO alarm',
  water: 'Water sensor',
  temperature: 'Temperature sensor',
  panic_button: 'Panic button',
  keyfob: 'Keyfob',
  keypad: 'Keypad',
  siren: 'Siren',
  other: 'Other device',
};

export const ZONE_TYPES = [
  'entry_exit',
  'perimeter',
  'interior_follower',
  'interior_instant',
  'fire_24h',
  'co_24h',
  'panic_audible',
  'panic_silent',
  'water_24h',
  'temperature_24h',
  'monitor_only',
] as const;
export type ZoneType = (typeof ZONE_TYPES)[number];

export const ZONE_TYPE_LABELS: Record<ZoneType, string> = {
  entry_exit: 'Entry/exit (delayed)',
  perimeter: 'Perimeter (instant)',
  interior_follower: 'Interior, follows entry delay',
  interior_instant: 'Interior, instant',
  fire_24h: 'Fire, always armed',
  co_24h: 'CO, always armed',
  panic_audible: 'Panic, audible',
  panic_silent: 'Panic, silent',
  water_24h: 'Water, always armed',
  temperature_24h: 'Temperature, always armed',
  monitor_only: 'Chime only: no alarm, never reported',
};

/** Zone types that are life-safety (fire/CO): no abort window, no swinger shutdown. */
export const LIFE_SAFETY_ZONE_TYPES: readonly ZoneType[] = ['fire_24h', 'co_24h'];

/**
 * The standard each life-safety device type is listed to, named beside it on staff screens so a
 * household smoke alarm is never confused with a system smoke detector. UL 217 (smoke alarms) and
 * UL 268 (system smoke detectors): references.md 4.4 (PUBLIC). UL 2034 (CO alarms): references.md
 * 4.18 (MEMORY). UL 521 (heat detectors): from memory.
 */
export const DEVICE_TYPE_STANDARDS: Partial<Record<DeviceType, string>> = {
  smoke: 'UL 217',
  smoke_detector: 'UL 268',
  smoke_co: 'UL 217 and UL 2034',
  heat: 'UL 521',
  co: 'UL 2034',
};

/** Devices that sense smoke: household smoke alarms, system smoke detectors and combination alarms. */
export const SMOKE_DEVICE_TYPES: readonly DeviceType[] = ['smoke', 'smoke_detector', 'smoke_co'];

/** Devices that sense carbon monoxide. */
export const CO_DEVICE_TYPES: readonly DeviceType[] = ['co', 'smoke_co'];

/** Devices that sense fire (smoke or heat): they belong on a fire zone. */
export const FIRE_DEVICE_TYPES: readonly DeviceType[] = ['smoke', 'smoke_detector', 'smoke_co', 'heat'];

/** Every life-safety device: smoke, heat and CO. Screens about them carry the caution. */
export const LIFE_SAFETY_DEVICE_TYPES: readonly DeviceType[] = ['smoke', 'smoke_detector', 'smoke_co', 'heat', 'co'];

/** True for smoke, heat and CO devices. */
export function isLifeSafetyDevice(deviceType: DeviceType): boolean {
  return LIFE_SAFETY_DEVICE_TYPES.includes(deviceType);
}

/** Equipment rather than detectors: they sense nothing in the home, and are described as what they are. */
export const EQUIPMENT_DEVICE_TYPES: readonly DeviceType[] = ['keyfob', 'keypad', 'siren'];

/** Contact devices: these protect an opening (door, window, …). */
export const OPENING_DEVICE_TYPES: readonly DeviceType[] = ['door_contact', 'window_contact', 'sliding_door_contact', 'garage_door_tilt'];

/** Devices that belong to a room rather than an opening. */
export const ROOM_DEVICE_TYPES: readonly DeviceType[] = ['motion', 'glass_break', 'smoke', 'smoke_detector', 'smoke_co', 'heat', 'co', 'water', 'temperature'];

export const ZONE_STATUSES = ['active', 'bypassed', 'removed'] as const;
export type ZoneStatus = (typeof ZONE_STATUSES)[number];

export const ZONE_STATUS_LABELS: Record<ZoneStatus, string> = {
  active: 'In service',
  bypassed: 'Bypassed',
  removed: 'Removed',
};

export const COMM_PATHS = ['cellular', 'ip', 'phone_line', 'combination'] as const;
export type CommPath = (typeof COMM_PATHS)[number];

export const COMM_PATH_LABELS: Record<CommPath, string> = {
  cellular: 'Cellular',
  ip: 'Internet (IP)',
  phone_line: 'Phone line',
  combination: 'Cellular + IP',
};

/** Battery types offered in the zone form; free text is accepted too. */
export const BATTERY_TYPES = ['CR2032', 'CR2450', 'CR123A', 'CR2', 'AA lithium', 'AAA alkaline', '9V lithium', 'sealed 10-year'] as const;
