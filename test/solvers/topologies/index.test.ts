import { describe, expect, it } from 'vitest';
import { TOPOLOGY_IDS } from '../../../solvers/spec/spec-schema.js';
import { flyback } from '../../../solvers/topologies/flyback.js';
import { TOPOLOGIES, topologyById } from '../../../solvers/topologies/index.js';

describe('topologyById', () => {
  it('topologyById(id) returns a topology carrying that id for every id the spec admits', () => {
    for (const id of TOPOLOGY_IDS) {
      // ref: spec contract, SpecSchema.topology names a registered topology
      expect(topologyById(id).id).toBe(id);
    }
    expect(TOPOLOGIES.flyback).toBe(flyback);
  });

  it('topologyById throws RangeError for an unknown id', () => {
    // ref: common practice, an unknown key is a programmer error
    expect(() => topologyById('buck' as never)).toThrow(RangeError);
  });
});
