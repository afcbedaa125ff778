/**
 * TRUST_PROXY as Express's `trust proxy` setting. Only a trusted proxy's X-Forwarded-For decides
 * `req.ip`, the address sign-in failures and other limits are counted by; trusting it from anyone
 * would let a client pick a fresh address for every guess.
 */
import express from 'express';

/** What Express accepts for `trust proxy`. */
export type TrustProxySetting = boolean | number | string[];

/**
 * `false` (the default): no proxy, the peer's address counts. `true`: every hop (only behind a
 * proxy that overwrites the header). A whole number: that many hops. Otherwise a comma-separated
 * list of addresses, CIDR ranges or Express's names (`loopback`, `linklocal`, `uniquelocal`).
 * Throws one line naming the bad entry when Express refuses the list.
 */
export function trustProxySetting(value: string): TrustProxySetting {
  const text = value.trim().toLowerCase();
  if (text === 'false') return false;
  if (text === 'true') return true;
  if (/^\d+$/.test(text)) return Number(text);
  const list = value
    .split(',')
    .map((entry) => entry.trim())
    .filter((entry) => entry !== '');
  try {
    // Express compiles the list when it is set; a throwaway app finds a bad entry before the real one starts.
    express().set('trust proxy', list);
  } catch (err) {
    throw new Error(`TRUST_PROXY: ${err instanceof Error ? err.message : String(err)} (expected false, true, a hop count, or addresses/CIDR ranges separated by commas)`);
  }
  return list;
}
