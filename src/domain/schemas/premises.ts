import { z } from 'zod';
import { OPENING_KINDS, ROOM_KINDS } from '../premises';
import { patchOf, uuid } from './common';

const name = (what: string, example: string) =>
  z
    .string({ error: `Name the ${what}.` })
    .trim()
    .min(1, `Name the ${what}, like “${example}”.`)
    .max(60, 'Use at most 60 characters.');

export const floorSchema = z.object({
  name: name('floor', 'Ground floor'),
  level: z.number({ error: 'Level is a whole number: 0 for ground, 1 upstairs, -1 basement.' }).int('Use a whole number.').min(-5, 'At least -5.').max(100, 'At most 100.'),
  belowGrade: z.boolean({ error: 'Below grade is yes or no.' }).default(false),
});
export const floorPatchSchema = patchOf(floorSchema);

export const roomSchema = z.object({
  name: name('room', 'Main bedroom'),
  kind: z.enum(ROOM_KINDS, { error: 'Choose what kind of room this is.' }),
  fuelBurningAppliance: z.boolean({ error: 'Fuel-burning appliance is yes or no.' }).default(false),
  attachedGarage: z.boolean({ error: 'Attached garage is yes or no.' }).default(false),
  /** a bedroom: the hall or landing serving its sleeping area (a room of the same site) */
  servedByHallId: uuid.nullable().default(null),
  hallWithin21FtConfirmed: z.boolean({ error: 'Within 21 ft is yes or no.' }).default(false),
  /** a bathroom: the bedroom it is attached to (a room of the same site) */
  attachedToBedroomId: uuid.nullable().default(null),
});
export const roomPatchSchema = patchOf(roomSchema).extend({
  /** move the room to another floor of the same site */
  floorId: uuid.optional(),
});

export const openingSchema = z.object({
  kind: z.enum(OPENING_KINDS, { error: 'Choose door, window, sliding door, garage door or skylight.' }),
  label: name('opening', 'Bay window left'),
  groundReachable: z.boolean({ error: 'Reachable from the ground is yes or no.' }).default(false),
});
export const openingPatchSchema = patchOf(openingSchema);

const fraction = (axis: string) => z.number({ error: `${axis} is a fraction between 0 and 1.` }).min(0, 'Between 0 and 1.').max(1, 'Between 0 and 1.');

/** A zone's pin on a floor plan: x and y as fractions of the image. */
export const pinSchema = z.object({ floorId: uuid, x: fraction('x'), y: fraction('y') });
