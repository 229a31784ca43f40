/**
 * Which site (1-based, in seeding order) shows which life-safety finding, so each one is seen
 * once in each demo firm. The first site is the demo household's home: it keeps to findings a
 * household would meet (a 21 ft distance to confirm) and a staff-only standby battery that is
 * too small.
 */
export const LIFE_SAFETY_SCENES = {
  distanceUnconfirmed: 1, // sleeping_area_distance_unconfirmed
  standbyShort: 1, // standby_battery_short
  smokeOnChimeZone: 2, // life_safety_zone_programming + CP-01 life_safety_device_on_wrong_zone
  sleepingAreaUnknown: 3, // sleeping_area_unknown
  standbyOld: 3, // standby_battery_old
  garageSmoke: 4, // smoke_in_garage
  hallAlarmInBathroom: 5, // smoke_missing_outside_sleeping_area (the alarm is in the bathroom)
  labelDateMissing: 6, // device life 'check' (manufacture date missing, recent install)
  coinCellSmoke: 6, // battery forecast under 1 year on a smoke alarm
  labelDateMissingOld: 7, // device life 'due' from the installation date alone
  ensuiteAppliance: 8, // co_missing_in_bedroom_with_appliance (appliance in the attached bathroom)
  phoneLineOnly: 9, // fire_phone_line_only
  slowPathSupervision: 10, // fire_single_path_unsupervised
  powerUnknown: 11, // standby_battery_unknown, standby_battery_age_unknown, fire_single_path_unknown
  halfEnrolledCombination: 12, // a combination smoke and CO alarm with only its smoke input enrolled
} as const;
