import { describe, expect, it } from 'vitest';
import { designView, designViewJson } from '../../api/designs/design-view.js';
import { evaluateSpec } from '../../api/designs/evaluate-spec.js';
import { EXAMPLE_SPECS } from '../../api/openapi/example-specs.js';
import { createMemoryDesignStore } from '../../api/stores/memory-design-store.js';
import { createMemoryMaterialStore } from '../../api/stores/memory-material-store.js';
import { SpecSchema } from '../../solvers/index.js';

// The design view is sent as text built around the stored JSON (no second serialization of the
// design); it must be exactly the text JSON.stringify gives for the view object.

describe('designViewJson', () => {
  it('is byte for byte JSON.stringify(designView(record)) in UTF-8, as created and as read back', async () => {
    const evaluated = await evaluateSpec(SpecSchema.parse(EXAMPLE_SPECS.conveyorControls), {
      materials: createMemoryMaterialStore(),
      tenant: 't',
    });
    if (!evaluated.ok) throw new Error('example spec is infeasible');
    const store = createMemoryDesignStore();
    const created = await store.create('t', evaluated.value);
    const appended = await store.appendRevision('t', created.id, evaluated.value);
    const read = await store.revision('t', created.id, 2);
    for (const record of [created, appended, read]) {
      if (record === undefined) throw new Error('missing revision');
      expect(designViewJson(record).toString('utf8')).toBe(JSON.stringify(designView(record)));
      expect(record.contentJson.toString('utf8')).toBe(
        JSON.stringify({ spec: record.spec, design: record.design, meta: record.meta }),
      );
    }
  });

  it('refuses stored text that is not a content object', () => {
    const record = {
      id: 'x',
      revision: 1,
      contentJson: Buffer.from('[1]'),
    } as unknown as Parameters<typeof designViewJson>[0];
    expect(() => designViewJson(record)).toThrow(/stored text is not a content/);
  });
});
