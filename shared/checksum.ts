/**
 * A short checksum of a sheet revision's content, so the repair shop and the
 * grinding shop can confirm they hold the same revision. SHA-256 comes from
 * @noble/hashes (pure JavaScript, synchronous; no node:crypto, no async WebCrypto) so the
 * server and the screens compute it the same way.
 */
import { sha256 } from '@noble/hashes/sha2.js';
import { bytesToHex, utf8ToBytes } from '@noble/hashes/utils.js';

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

/**
 * JSON with object keys sorted at every level and no whitespace. Numbers are
 * written as JSON writes them; `undefined` object members are left out, as in JSON.
 */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(sortKeys(value));
}

function sortKeys(value: unknown): Json {
  if (value === null || typeof value !== 'object') {
    if (typeof value === 'number' && !Number.isFinite(value)) throw new Error('Checksums need finite numbers');
    return value as Json;
  }
  if (Array.isArray(value)) return value.map((v) => (v === undefined ? null : sortKeys(v)));
  const out: { [key: string]: Json } = {};
  for (const key of Object.keys(value).sort()) {
    const v = (value as Record<string, unknown>)[key];
    if (v !== undefined) out[key] = sortKeys(v);
  }
  return out;
}

/** SHA-256 (FIPS 180-4) of a string's UTF-8 bytes, as 64 lowercase hex characters. */
export function sha256Hex(input: string): string {
  return bytesToHex(sha256(utf8ToBytes(input)));
}

/** The content a revision's checksum covers. */
export type ChecksumContent = { number: number; label: string; spec: unknown; engine: unknown; note: string; coreNotes?: string };

/**
 * First 12 hex characters of SHA-256 over the canonical JSON of the revision's number, label, spec, engine, note and
 * core notes. Empty core notes are left out, so a revision written before they travelled keeps its checksum.
 */
export function revisionChecksum({ number, label, spec, engine, note, coreNotes }: ChecksumContent): string {
  return sha256Hex(canonicalJson({ number, label, spec, engine, note, coreNotes: coreNotes || undefined })).slice(0, 12);
}

/** What the owner is offered for one option: the revision (by its checksum) and the terms. */
export type OfferContent = { checksum: string; title: string; priceCents: number; depositCents: number; currency: string; leadTimeDays: number };

/**
 * First 12 hex characters of SHA-256 over the canonical JSON of the whole offer. The
 * owner's approval quotes it, so a price, deposit, currency, lead time, title or
 * revision changed after the page was read is refused rather than approved unseen.
 */
export function offerChecksum({ checksum, title, priceCents, depositCents, currency, leadTimeDays }: OfferContent): string {
  return sha256Hex(canonicalJson({ checksum, title, priceCents, depositCents, currency, leadTimeDays })).slice(0, 12);
}
