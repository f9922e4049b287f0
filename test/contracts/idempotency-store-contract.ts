import { describe, expect, it } from 'vitest';
import type { IdempotencyStore } from '../../api/idempotency/idempotency-store.js';

const RESPONSE = {
  status: 201,
  headers: { 'content-type': 'application/json', location: '/v1/designs/d-1' },
  body: new TextEncoder().encode('{"id":"d-1","note":"Δ µ"}'),
};

/** What every IdempotencyStore must do; `fresh` gives an empty store. */
export function idempotencyStoreContract(name: string, fresh: () => Promise<IdempotencyStore>) {
  describe(`${name} keeps the IdempotencyStore contract`, () => {
    it('the first begin claims a key; a second with the same fingerprint finds it in progress', async () => {
      const store = await fresh();
      expect(await store.begin('k', 'f', 10_000)).toEqual({ kind: 'claimed' });
      expect(await store.begin('k', 'f', 10_000)).toEqual({ kind: 'in-progress' });
      await store.close();
    });

    it('after complete, the same fingerprint replays the response and another is a mismatch', async () => {
      const store = await fresh();
      await store.begin('k', 'f', 10_000);
      await store.complete('k', 'f', RESPONSE, 10_000);
      expect(await store.begin('k', 'f', 10_000)).toEqual({ kind: 'replay', response: RESPONSE });
      expect(await store.begin('k', 'other', 10_000)).toEqual({ kind: 'mismatch' });
      await store.close();
    });

    it('release frees a claim for a retry, but never a completed response', async () => {
      const store = await fresh();
      await store.begin('k', 'f', 10_000);
      await store.release('k', 'f');
      expect(await store.begin('k', 'f', 10_000)).toEqual({ kind: 'claimed' });
      await store.complete('k', 'f', RESPONSE, 10_000);
      await store.release('k', 'f');
      expect((await store.begin('k', 'f', 10_000)).kind).toBe('replay');
      await store.close();
    });

    it('a claim lapses after its time to live, so a crashed request does not hold its key', async () => {
      const store = await fresh();
      await store.begin('k', 'f', 30);
      await new Promise((resolve) => setTimeout(resolve, 80));
      expect(await store.begin('k', 'f', 10_000)).toEqual({ kind: 'claimed' });
      await store.close();
    });

    it('of many concurrent begins on one key exactly one claims it', async () => {
      const store = await fresh();
      const outcomes = await Promise.all(
        Array.from({ length: 20 }, () => store.begin('race', 'f', 10_000)),
      );
      expect(outcomes.filter((outcome) => outcome.kind === 'claimed')).toHaveLength(1);
      expect(outcomes.filter((outcome) => outcome.kind === 'in-progress')).toHaveLength(19);
      await store.close();
    });
  });
}
