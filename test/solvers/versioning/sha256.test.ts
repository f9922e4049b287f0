import { createHash, randomBytes } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { inputHash } from '../../../solvers/index.js';
import { canonicalJson } from '../../../solvers/versioning/canonical-json.js';
import { sha256Hex } from '../../../solvers/versioning/sha256.js';

const utf8 = (text: string) => new TextEncoder().encode(text);

describe('sha256Hex (FIPS 180-4)', () => {
  it('gives the digests of the standard examples', () => {
    // NIST, "Secure Hash Standard" FIPS 180-2, Appendix B.1–B.3 (one block, two blocks, a
    // million 'a'); the empty message's digest is the one every SHA-256 implementation gives.
    expect(sha256Hex(utf8('abc'))).toBe(
      'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad',
    );
    expect(sha256Hex(utf8('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq'))).toBe(
      '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1',
    );
    expect(sha256Hex(utf8('a'.repeat(1_000_000)))).toBe(
      'cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0',
    );
    expect(sha256Hex(new Uint8Array(0))).toBe(
      'e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855',
    );
  });

  it('agrees with OpenSSL (node:crypto) at every length around the block boundaries', () => {
    for (let length = 0; length <= 200; length++) {
      const bytes = randomBytes(length);
      expect(sha256Hex(bytes), `length ${length}`).toBe(
        createHash('sha256').update(bytes).digest('hex'),
      );
    }
  });

  it('inputHash is the SHA-256 of the canonical JSON in UTF-8, as before (Web Crypto)', async () => {
    const input = { b: 'Δ 60 °C', a: [1, 0.1, 2e-7] };
    const bytes = utf8(canonicalJson(input));
    const webCrypto = Buffer.from(await crypto.subtle.digest('SHA-256', bytes)).toString('hex');
    expect(await inputHash(input)).toBe(webCrypto);
  });
});
