/** Premises vocabulary (product.md, "Premises and coverage"): floors, rooms, openings. */
export const ROOM_KINDS = ['bedroom', 'kitchen', 'living', 'dining', 'hall', 'bath', 'garage', 'basement', 'utility', 'office', 'other'] as const;
export type RoomKind = (typeof ROOM_KINDS)[number];

export const ROOM_KIND_LABELS: Record<RoomKind, string> = {
  bedroom: 'Bedroom',
  kitchen: 'Kitchen',
  living: 'Living room',
  dining: 'Dining room',
  hall: 'Hall or landing',
  bath: 'Bathroom',
  garage: 'Garage',
  basement: 'Basement room',
  utility: 'Utility room',
  office: 'Office',
  other: 'Other room',
};

export const OPENING_KINDS = ['door', 'window', 'sliding_door', 'garage_door', 'skylight'] as const;
export type OpeningKind = (typeof OPENING_KINDS)[number];

export const OPENING_KIND_LABELS: Record<OpeningKind, string> = {
  door: 'Door',
  window: 'Window',
  sliding_door: 'Sliding door',
  garage_door: 'Garage door',
  skylight: 'Skylight',
};
