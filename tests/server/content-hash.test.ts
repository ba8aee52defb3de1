import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { sha256Hex, contentHash } from '../../server/services/templates';
import { canonicalJson } from '../../shared/interchange/canonical-json';
import { content } from '../shared/station-fixtures';

describe('content hash', () => {
  it('is SHA-256: the FIPS 180-4 example "abc" gives ba7816bf…15ad', () => {
    // FIPS 180-4 (Secure Hash Standard), SHA-256 example for the message "abc".
    expect(sha256Hex('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(sha256Hex('')).toBe(createHash('sha256').update('').digest('hex'));
  });

  it('hashes the canonical JSON of the layout: key order does not matter, the name is left out, any geometric change counts', () => {
    const a = content({ placements: [{ id: 'P1', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse: [0, 1] }] });
    const reverseKeys = (v: unknown): unknown =>
      Array.isArray(v) ? v.map(reverseKeys) : v && typeof v === 'object' ? Object.fromEntries(Object.entries(v).reverse().map(([k, x]) => [k, reverseKeys(x)])) : v;
    const reordered = reverseKeys(a) as typeof a;
    expect(JSON.stringify(reordered)).not.toBe(JSON.stringify(a));
    expect(canonicalJson(reordered)).toBe(canonicalJson(a));
    expect(contentHash(reordered)).toBe(contentHash(a));
    expect(contentHash({ ...a, name: 'Renamed' })).toBe(contentHash(a));
    const moved = { ...a, placements: a.placements.map((p, i) => (i === 0 ? { ...p, hole: { ...p.hole, col: p.hole.col + 1 } } : p)) };
    expect(contentHash(moved)).not.toBe(contentHash(a));
    // Canonical form: sorted keys, no white space (RFC 8785 style ordering of object members).
    expect(canonicalJson({ b: 1, a: [true, null, 'x'] })).toBe('{"a":[true,null,"x"],"b":1}');
  });
});
