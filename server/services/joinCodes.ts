/**
 * Join codes: 8 characters from an alphabet without look-alikes (no 0/O, 1/I/L), shown as
 * `XXXX-XXXX`. 31^8 ≈ 8.5 × 10^11 codes, so guessing one is hopeless at the sign-up rate limit.
 */
import { randomInt } from 'node:crypto';

const ALPHABET = '23456789ABCDEFGHJKMNPQRSTUVWXYZ';

export function newJoinCode(): string {
  const chars = Array.from({ length: 8 }, () => ALPHABET[randomInt(ALPHABET.length)]);
  return `${chars.slice(0, 4).join('')}-${chars.slice(4).join('')}`;
}
