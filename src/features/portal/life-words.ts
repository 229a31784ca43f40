/**
 * A device's upkeep in the household's words (design-language.md: "Battery due in March").
 * The server sends the dates from the firm's upkeep model; this only words them.
 *
 * Smoke, heat and CO devices are never "good until" anything: they are worded by the date to
 * replace them, and when that date rests on the installation date (the manufacture date is not on
 * record) the household is asked to check the date on the device's label.
 */
import type { PortalDevice, PortalDeviceLife } from '@/types/api';

export type LifeTone = 'ok' | 'warn' | 'bad' | 'neutral';

export interface LifeWords {
  text: string;
  tone: LifeTone;
}

/** "March 2027" from "2027-03-14", whatever the browser's time zone. */
export function monthYear(date: string): string {
  return new Intl.DateTimeFormat('en-US', { month: 'long', year: 'numeric', timeZone: 'UTC' }).format(new Date(`${date}T00:00:00Z`));
}

/** Asked of the household when the replacement date rests on the installation date, or on nothing. */
export const CHECK_LABEL = 'Check the date on its label';
const CHECK_LABEL_AFTER = 'check the date on its label';

/** Whether the battery comes before the end of life (the end of life wins a tie: replacing it renews the battery). */
function batteryFirst(life: PortalDeviceLife): boolean {
  const { batteryDueOn, endOfLifeOn } = life;
  if (!batteryDueOn) return false;
  return !endOfLifeOn || batteryDueOn < endOfLifeOn;
}

function batteryWords(state: PortalDeviceLife['state'], on: string): LifeWords {
  const when = monthYear(on);
  if (state === 'due') return { text: `Battery due since ${when}`, tone: 'bad' };
  if (state === 'soon') return { text: `Battery due in ${when}`, tone: 'warn' };
  return { text: `Battery due ${when}`, tone: 'neutral' };
}

/** The words for a smoke, heat or CO device. */
function lifeSafetyWords(life: PortalDeviceLife): LifeWords {
  const basis = life.endOfLifeBasis ?? (life.endOfLifeOn ? 'manufactured' : 'unknown');
  const labelUnsure = basis === 'installed' || basis === 'unknown';
  const withLabel = (words: LifeWords): LifeWords => (labelUnsure ? { ...words, text: `${words.text} — ${CHECK_LABEL_AFTER}` } : words);

  // the battery comes first and is due or near: say so (and still ask for the label when unsure)
  if (life.batteryDueOn && batteryFirst(life) && (life.state === 'due' || life.state === 'soon')) return withLabel(batteryWords(life.state, life.batteryDueOn));

  const end = life.endOfLifeOn;
  if (!end) {
    // no end-of-life date at all: the manufacture and installation dates are both missing
    return { text: CHECK_LABEL, tone: life.state === 'due' ? 'bad' : 'warn' };
  }
  const when = monthYear(end);
  if (basis === 'installed') {
    // the date is the latest it can be: the device was made on or before the day it was fitted
    if (life.state === 'due') return { text: 'Replace now: even the latest date has passed', tone: 'bad' };
    if (life.state === 'soon') return { text: `Replace by ${when} at the latest — ${CHECK_LABEL_AFTER}`, tone: 'warn' };
    return { text: `${CHECK_LABEL} — replace by ${when} at the latest`, tone: 'warn' };
  }
  if (life.state === 'due') return { text: 'Replace now: past its end of life', tone: 'bad' };
  if (life.state === 'soon') return { text: `Replace by ${when}`, tone: 'warn' };
  if (life.state === 'check') return { text: `${CHECK_LABEL} — replace by ${when}`, tone: 'warn' };
  return { text: `Replace by ${when}`, tone: 'ok' };
}

/**
 * A device's upkeep in words and a tone. `lifeSafety` is the device's own flag from the server; a
 * device with an end-of-life date or basis, or in the 'check' state, is worded as one too.
 */
export function lifeWords(life: PortalDeviceLife, lifeSafety = false): LifeWords {
  const smokeHeatOrCo = lifeSafety || life.state === 'check' || life.endOfLifeOn !== null || (life.endOfLifeBasis !== undefined && life.endOfLifeBasis !== null);
  if (smokeHeatOrCo) return lifeSafetyWords(life);
  if (life.batteryDueOn) return batteryWords(life.state, life.batteryDueOn);
  return { text: 'No battery date on record', tone: 'neutral' };
}

/** The words of a device as the portal lists it. */
export function deviceLifeWords(device: Pick<PortalDevice, 'life' | 'lifeSafety'>): LifeWords {
  return lifeWords(device.life, device.lifeSafety === true);
}

/** A smoke, heat or CO device whose zone is not programmed to protect (the device's `whenArmed` says why). */
export function isNotProtecting(device: Pick<PortalDevice, 'protects'>): boolean {
  return device.protects === false;
}

export const NOT_PROTECTING = 'Not protecting';
