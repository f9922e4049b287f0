import { beforeAll, describe, expect, it } from 'vitest';
import { userMaterialContent } from '../../api/catalog/user-material-content.js';
import { EXAMPLE_MATERIALS } from '../../api/openapi/example-materials.js';
import { MaterialRequestSchema } from '../../api/schemas/material-request-schema.js';
import type { MaterialStore, UserMaterialContent } from '../../api/stores/material-store.js';

/** Real content (fitted by the engine) under `name`, as JSON carries it. */
function content(name: string): UserMaterialContent {
  const request = MaterialRequestSchema.parse({ ...EXAMPLE_MATERIALS.labFerrite, name });
  const fitted = userMaterialContent(request);
  if (!fitted.ok)
    throw new Error(`example material does not fit: ${JSON.stringify(fitted.issues)}`);
  return JSON.parse(JSON.stringify(fitted.value)) as UserMaterialContent;
}

/** The tenant the contract's data belongs to, and another that must never see it. */
const TENANT = 'tenant-a';
const OTHER_TENANT = 'tenant-b';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;

/**
 * The MaterialStore contract every implementation keeps: ids random, names unique ignoring case
 * (one winner among concurrent creates), records unchanged as read back, list in creation
 * order, undefined for anything missing. `makeStore` gives a fresh, empty store per call.
 */
export function materialStoreContract(name: string, makeStore: () => Promise<MaterialStore>): void {
  describe(`${name} keeps the MaterialStore contract`, () => {
    let first: UserMaterialContent;
    let second: UserMaterialContent;
    beforeAll(() => {
      first = content('Contract Ferrite A');
      second = content('contract-ferrite-b');
    });

    it('create() stores a material under a fresh random UUID, read back unchanged', async () => {
      const store = await makeStore();
      const a = await store.create(TENANT, first);
      if (a === 'name-taken') throw new Error('fresh store refused a name');
      expect(a.id).toMatch(UUID);
      expect(a).toEqual({ id: a.id, ...first });
      expect(await store.get(TENANT, a.id)).toEqual(a);
      await store.close();
    });

    it('list() is empty at first, then every material in creation order', async () => {
      const store = await makeStore();
      expect(await store.list(TENANT)).toEqual([]);
      const a = await store.create(TENANT, first);
      const b = await store.create(TENANT, second);
      expect(await store.list(TENANT)).toEqual([a, b]);
      await store.close();
    });

    it('create() answers name-taken for a name in use, ignoring case and surrounding spaces', async () => {
      const store = await makeStore();
      await store.create(TENANT, first);
      expect(await store.create(TENANT, { ...second, name: 'contract ferrite a' })).toBe(
        'name-taken',
      );
      expect(await store.create(TENANT, { ...second, name: '  CONTRACT FERRITE A ' })).toBe(
        'name-taken',
      );
      expect(await store.list(TENANT)).toHaveLength(1);
      await store.close();
    });

    it('of concurrent create() calls with one name exactly one succeeds', async () => {
      const store = await makeStore();
      const outcomes = await Promise.all(
        Array.from({ length: 12 }, () => store.create(TENANT, first)),
      );
      expect(outcomes.filter((outcome) => outcome !== 'name-taken')).toHaveLength(1);
      expect(await store.list(TENANT)).toHaveLength(1);
      await store.close();
    });

    it('a record a caller changes after reading stays unchanged in the store', async () => {
      const store = await makeStore();
      const a = await store.create(TENANT, first);
      if (a === 'name-taken') throw new Error('fresh store refused a name');
      const read = await store.get(TENANT, a.id);
      if (!read) throw new Error('missing');
      read.name = 'changed';
      read.fit.coefficients.alpha = -1;
      expect(await store.get(TENANT, a.id)).toEqual(a);
      await store.close();
    });

    it('get() of an id no material has is undefined', async () => {
      const store = await makeStore();
      await store.create(TENANT, first);
      expect(await store.get(TENANT, '00000000-0000-4000-8000-000000000000')).toBeUndefined();
      await store.close();
    });

    it('isReady() is true while open and false after close()', async () => {
      const store = await makeStore();
      expect(await store.isReady()).toBe(true);
      await store.close();
      expect(await store.isReady()).toBe(false);
    });

    it('another tenant neither reads nor lists a material, and may reuse its name', async () => {
      const store = await makeStore();
      const a = await store.create(TENANT, first);
      if (a === 'name-taken') throw new Error('name taken in an empty store');
      expect(await store.get(OTHER_TENANT, a.id)).toBeUndefined();
      expect(await store.list(OTHER_TENANT)).toEqual([]);
      const theirs = await store.create(OTHER_TENANT, first);
      expect(theirs).not.toBe('name-taken');
      expect(await store.list(TENANT)).toEqual([a]);
    });
  });
}
