/**
 * Phone numbers, checked and written the same way on both sides (libphonenumber-js).
 * "Possible" rather than "valid" numbers are accepted: a number's length and shape are
 * checked, not whether its exchange is in service today.
 */
import { parsePhoneNumberFromString, type CountryCode } from 'libphonenumber-js';

export function isPossiblePhone(value: string, country: CountryCode = 'US'): boolean {
  const parsed = parsePhoneNumberFromString(value, country);
  return !!parsed && parsed.isPossible();
}

/** "+1 555 010 4400" style for display; the input as written when it cannot be parsed. */
export function formatPhone(value: string, country: CountryCode = 'US'): string {
  if (!value) return '';
  const parsed = parsePhoneNumberFromString(value, country);
  return parsed ? parsed.formatInternational() : value;
}

/** E.164 ("+15550104400") for storage; the trimmed input when it cannot be parsed. */
export function normalizePhone(value: string, country: CountryCode = 'US'): string {
  const parsed = parsePhoneNumberFromString(value, country);
  return parsed?.isPossible() ? parsed.number : value.trim();
}
