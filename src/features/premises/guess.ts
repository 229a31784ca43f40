/**
 * Guesses that save keystrokes while a layout is typed in: the kind of a room from its name
 * ("Bedroom 2" → bedroom), the kind of an opening from its label ("Patio slider" → sliding
 * door). A kind chosen by hand always wins.
 */
import type { OpeningKind, RoomKind } from '@domain/premises';

const ROOM_WORDS: [RegExp, RoomKind][] = [
  [/\bgarage|carport/, 'garage'],
  [/bath|shower|toilet|\bwc\b|powder|en-?suite|washroom/, 'bath'],
  [/bed|nursery|guest|sleeping/, 'bedroom'],
  [/kitchen|pantry|kitchenette/, 'kitchen'],
  [/dining/, 'dining'],
  [/living|lounge|family|sitting|sun ?room|great room/, 'living'],
  [/basement|cellar/, 'basement'],
  [/utility|laundry|mud ?room|boiler|furnace|plant room/, 'utility'],
  [/office|study|\bden\b|library/, 'office'],
  [/hall|landing|stair|corridor|foyer|entry|entrance|porch|vestibule|lobby/, 'hall'],
];

export function guessRoomKind(name: string): RoomKind | null {
  const text = name.trim().toLowerCase();
  if (!text) return null;
  return ROOM_WORDS.find(([re]) => re.test(text))?.[1] ?? null;
}

const OPENING_WORDS: [RegExp, OpeningKind][] = [
  [/skylight|roof ?light|roof window/, 'skylight'],
  [/slid|slider|patio door/, 'sliding_door'],
  [/garage.*door|overhead|roller door/, 'garage_door'],
  [/door|gate/, 'door'],
  [/window|bay|sash|casement|pane|well|transom/, 'window'],
];

export function guessOpeningKind(label: string): OpeningKind | null {
  const text = label.trim().toLowerCase();
  if (!text) return null;
  return OPENING_WORDS.find(([re]) => re.test(text))?.[1] ?? null;
}

/** A fraction of the image, kept in [0, 1] and to four places (a tenth of a pixel on a 1000 px plan). */
export function toFraction(value: number): number {
  const clamped = Math.min(1, Math.max(0, Number.isFinite(value) ? value : 0));
  return Math.round(clamped * 10000) / 10000;
}
