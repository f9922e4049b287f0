import { describe, expect, it } from 'vitest';
import { canonicalJson } from '../../../solvers/versioning/canonical-json.js';
import { inputHash } from '../../../solvers/versioning/result-meta.js';

/** Web Crypto's SHA-256 of the canonical JSON: how `inputHash` was computed before. */
async function webCryptoHash(input: unknown): Promise<string> {
  const digest = await crypto.subtle.digest(
    'SHA-256',
    new TextEncoder().encode(canonicalJson(input)),
  );
  return Buffer.from(digest).toString('hex');
}

describe('inputHash', () => {
  it('is SHA-256 of the canonical JSON: "{}" gives the digest coreutils sha256sum prints', async () => {
    // `printf '{}' | sha256sum` (GNU coreutils, FIPS 180-4 SHA-256).
    expect(await inputHash({})).toBe(
      '44136fa355b3678a1146ad16f7e8649e94fb4fc21fe77e8310c060f61caaff8a',
    );
  });

  it('ignores key order and equals the Web Crypto digest it replaced, non-ASCII included', async () => {
    const spec = { z: [1, 2.5, null], a: { note: 'Wärme, µH, 電源' }, m: true };
    const reordered = { m: true, a: { note: 'Wärme, µH, 電源' }, z: [1, 2.5, null] };
    expect(await inputHash(reordered)).toBe(await inputHash(spec));
    expect(await inputHash(spec)).toBe(await webCryptoHash(spec));
    expect(await inputHash({ ...spec, m: false })).not.toBe(await inputHash(spec));
  });
});
