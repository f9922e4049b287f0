import { beforeAll, describe, expect, it } from 'vitest';
import { evaluateSpec } from '../../api/designs/evaluate-spec.js';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { createMemoryMaterialStore } from '../../api/stores/memory-material-store.js';
import {
  encodedContent,
  type DesignContent,
  type DesignStore,
} from '../../api/stores/design-store.js';
import { SpecSchema } from '../../solvers/index.js';

/** The tenant the contract's data belongs to, and another that must never see it. */
const TENANT = 'tenant-a';
const OTHER_TENANT = 'tenant-b';

/** Real content from the engine, as JSON carries it (what every store gives back). */
async function content(specInput: unknown): Promise<DesignContent> {
  const evaluated = await evaluateSpec(SpecSchema.parse(specInput), {
    materials: createMemoryMaterialStore(),
    tenant: TENANT,
  });
  if (!evaluated.ok)
    throw new Error(`example spec is infeasible: ${JSON.stringify(evaluated.issues)}`);
  return JSON.parse(JSON.stringify(evaluated.value)) as DesignContent;
}

/**
 * The DesignStore contract every implementation keeps: ids random, revisions numbered from 1 in
 * append order and immutable, concurrent appends distinct, undefined for anything missing;
 * contents come back as their JSON round trip, with that JSON text (`contentJson`) beside them.
 * `makeStore` gives a fresh, empty store per call.
 */
export function designStoreContract(name: string, makeStore: () => Promise<DesignStore>): void {
  describe(`${name} keeps the DesignStore contract`, () => {
    let first: DesignContent;
    let second: DesignContent;
    beforeAll(async () => {
      first = await content(EXAMPLE_SPECS.packagingAux);
      second = await content(EXAMPLE_SPECS.logicSupply);
    });

    it('create() stores revision 1 under a fresh random UUID, read back unchanged', async () => {
      const store = await makeStore();
      const a = await store.create(TENANT, first);
      const b = await store.create(TENANT, first);
      expect(a.id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
      expect(b.id).not.toBe(a.id);
      expect(a).toEqual({
        id: a.id,
        revision: 1,
        ...first,
        contentJson: Buffer.from(JSON.stringify(first)),
      });
      expect(await store.latest(TENANT, a.id)).toEqual(a);
      expect(await store.revision(TENANT, a.id, 1)).toEqual(a);
      await store.close();
    });

    it('appendRevision() numbers revisions 2, 3… and leaves earlier ones unchanged', async () => {
      const store = await makeStore();
      const a = await store.create(TENANT, first);
      const two = await store.appendRevision(TENANT, a.id, second);
      const three = await store.appendRevision(TENANT, a.id, first);
      expect(two).toEqual({
        id: a.id,
        revision: 2,
        ...second,
        contentJson: Buffer.from(JSON.stringify(second)),
      });
      expect(three?.revision).toBe(3);
      expect(await store.revision(TENANT, a.id, 1)).toEqual(a);
      expect(await store.revision(TENANT, a.id, 2)).toEqual(two);
      expect(await store.latest(TENANT, a.id)).toEqual(three);
      expect(await store.listRevisions(TENANT, a.id)).toEqual(
        [first, second, first].map((item, index) => ({
          revision: index + 1,
          createdAt: item.meta.createdAt,
          inputHash: item.meta.inputHash,
        })),
      );
      await store.close();
    });

    it('a content that carries its bytes (encodedContent) is stored as those bytes', async () => {
      const store = await makeStore();
      const encoded = encodedContent(first);
      expect(encoded.contentJson).toEqual(Buffer.from(JSON.stringify(first)));
      const a = await store.create(TENANT, encoded);
      const two = await store.appendRevision(TENANT, a.id, encodedContent(second));
      // The very bytes, not serialized again; the design is read back from them.
      expect(a.contentJson).toBe(encoded.contentJson);
      expect(a.design).toEqual(first.design);
      expect(two?.contentJson).toEqual(Buffer.from(JSON.stringify(second)));
      expect((await store.latest(TENANT, a.id))?.design).toEqual(second.design);
      expect(await store.revision(TENANT, a.id, 1)).toEqual({
        id: a.id,
        revision: 1,
        ...first,
        contentJson: encoded.contentJson,
      });
      await store.close();
    });

    it('concurrent appendRevision() calls get distinct consecutive numbers', async () => {
      const store = await makeStore();
      const a = await store.create(TENANT, first);
      const appended = await Promise.all(
        Array.from({ length: 12 }, () => store.appendRevision(TENANT, a.id, second)),
      );
      const numbers = appended
        .map((record) => record?.revision)
        .sort((x, y) => (x ?? 0) - (y ?? 0));
      expect(numbers).toEqual(Array.from({ length: 12 }, (_, index) => index + 2));
      expect(await store.listRevisions(TENANT, a.id)).toHaveLength(13);
      await store.close();
    });

    it('a record a caller changes after reading stays unchanged in the store', async () => {
      const store = await makeStore();
      const a = await store.create(TENANT, first);
      const read = await store.latest(TENANT, a.id);
      if (!read) throw new Error('missing');
      read.design.choices.turnsRatio = -1;
      read.meta.inputHash = 'changed';
      expect(await store.latest(TENANT, a.id)).toEqual(a);
      await store.close();
    });

    it('anything missing reads as undefined', async () => {
      const store = await makeStore();
      const a = await store.create(TENANT, first);
      const unknown = '00000000-0000-4000-8000-000000000000';
      expect(await store.latest(TENANT, unknown)).toBeUndefined();
      expect(await store.listRevisions(TENANT, unknown)).toBeUndefined();
      expect(await store.appendRevision(TENANT, unknown, first)).toBeUndefined();
      expect(await store.latest(TENANT, unknown)).toBeUndefined();
      for (const revision of [0, 2, -1, 1.5]) {
        expect(await store.revision(TENANT, a.id, revision)).toBeUndefined();
      }
      await store.close();
    });

    it('isReady() is true while open and false after close()', async () => {
      const store = await makeStore();
      expect(await store.isReady()).toBe(true);
      await store.close();
      expect(await store.isReady()).toBe(false);
    });

    it("another tenant's reads, listings and appends find nothing, exactly as for an unknown id", async () => {
      const store = await makeStore();
      const a = await store.create(TENANT, first);
      expect(await store.latest(OTHER_TENANT, a.id)).toBeUndefined();
      expect(await store.revision(OTHER_TENANT, a.id, 1)).toBeUndefined();
      expect(await store.listRevisions(OTHER_TENANT, a.id)).toBeUndefined();
      expect(await store.appendRevision(OTHER_TENANT, a.id, second)).toBeUndefined();
      // The owner's design is untouched by the other tenant's attempt.
      expect(await store.listRevisions(TENANT, a.id)).toHaveLength(1);
    });
  });
}
