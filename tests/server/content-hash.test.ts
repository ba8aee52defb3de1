import { describe, expect, it } from 'vitest';
import { sha256Hex, contentHash } from '../../server/services/templates';
import { canonicalJson } from '../../shared/interchange/canonical-json';
import { content } from '../shared/station-fixtures';

describe('content hash', () => {
  it.each([
    // NIST CSRC "Cryptographic Standards and Guidelines — Examples with Intermediate Values",
    // SHA256.pdf (FIPS 180-4): one-block message "abc" and the two-block 448-bit message.
    ['abc', 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad'],
    ['abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq', '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1'],
    // The empty message: NIST CAVP SHAVS byte-oriented test vectors (SHA256ShortMsg.rsp, Len = 0).
    ['', 'e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855'],
  ])('is SHA-256 of the UTF-8 text: FIPS 180-4 example %j', (message, digest) => {
    expect(sha256Hex(message)).toBe(digest);
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
    const renamedComponent = { ...a, placements: a.placements.map((p, i) => (i === 0 ? { ...p, component: 'CR-9' } : p)) };
    expect(contentHash(renamedComponent)).not.toBe(contentHash(a));
    const turned = { ...a, placements: a.placements.map((p, i) => (i === 0 ? { ...p, rotation: 90 as const } : p)) };
    expect(contentHash(turned)).not.toBe(contentHash(a));
    const moved = { ...a, placements: a.placements.map((p, i) => (i === 0 ? { ...p, hole: { ...p.hole, col: p.hole.col + 1 } } : p)) };
    expect(contentHash(moved)).not.toBe(contentHash(a));
    // Canonical form: sorted keys, no white space (RFC 8785 style ordering of object members).
    expect(canonicalJson({ b: 1, a: [true, null, 'x'] })).toBe('{"a":[true,null,"x"],"b":1}');
    // The hash is of that text and nothing else: the FIPS 180-4 "abc" digest, reached through a canonical form.
    expect(sha256Hex(canonicalJson('abc').slice(1, -1))).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    // Array order is part of the layout (stations are numbered in it): swapping two entries changes the hash.
    expect(sha256Hex(canonicalJson([1, 2]))).not.toBe(sha256Hex(canonicalJson([2, 1])));
  });
});
