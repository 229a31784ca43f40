/** Ids shaped like Stripe's: a type prefix and random letters and digits. */
import { randomBytes } from 'node:crypto';

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789';

export function randomChars(length: number, alphabet = ALPHABET): string {
  const bytes = randomBytes(length);
  let out = '';
  // 256 is not a multiple of 62; the slight bias does not matter for test ids.
  for (const byte of bytes) out += alphabet[byte % alphabet.length];
  return out;
}

export type IdPrefix = 'cus_' | 'prod_' | 'price_' | 'cs_test_' | 'sub_' | 'si_' | 'in_' | 'il_' | 'bps_' | 'bpc_' | 'evt_' | 'req_';

export function newId(prefix: IdPrefix): string {
  return prefix + randomChars(prefix === 'cs_test_' ? 58 : 24);
}

/** A customer's invoice prefix: eight capital letters and digits, as in "7F3A9C2B-0001". */
export function newInvoicePrefix(): string {
  return randomChars(8, 'ABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789');
}
