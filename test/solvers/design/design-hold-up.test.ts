import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../solvers/design/design-converter.js';
import { DesignSchema, type Design } from '../../../solvers/design/design-schema.js';
import { SpecSchema, TOPOLOGY_IDS, type Spec } from '../../../solvers/spec/spec-schema.js';
import { expectClose } from '../../helpers/expect-close.js';
import { busSpec, telecomSpec } from '../../helpers/flyback-specs.js';

const HOLD_UP_TIME_S = 0.01;

function withTopology(spec: Spec, topology: Spec['topology'], holdUp?: Spec['holdUp']): Spec {
  return SpecSchema.parse({ ...spec, topology, ...(holdUp ? { holdUp } : {}) });
}

function fullLoadCorner(design: Design, label: string) {
  const corner = design.corners.find((item) => item.label === label);
  if (!corner) throw new Error(`no corner ${label}`);
  return corner;
}

describe('designConverter with holdUp', () => {
  // Every registered topology on the invented telecom scenario, so new ones are covered too.
  for (const topology of TOPOLOGY_IDS) {
    const plain = designConverter(withTopology(telecomSpec(), topology));
    const held = designConverter(withTopology(telecomSpec(), topology, { timeS: HOLD_UP_TIME_S }));

    it(`designConverter(${topology} + holdUp) sizes the bulk capacitor from the energy it gives up`, () => {
      if (!plain.ok) {
        // ref: spec contract, hold-up is sized only for a converter that meets the spec
        expect(held).toEqual(plain);
        return;
      }
      if (!held.ok) throw new Error(JSON.stringify(held.issues));
      const block = held.value.holdUp;
      if (!block) throw new Error('no holdUp block');
      // ref: spec contract, the topology's design schema spreads DESIGN_LEVEL_FIELDS, so the
      // block survives parsing (z.object would strip an undeclared key)
      expect(DesignSchema.parse(held.value).holdUp).toEqual(block);
      // ref: spec contract, the defaults: start at nominal input, end at minimum input
      expect([block.startVoltageV, block.endVoltageV]).toEqual([48, 36]);
      expect(block.origins).toEqual({ startVoltageV: 'default', endVoltageV: 'default' });
      // Consistency check, no outside reference: with the default voltages the points solved
      // are the design's own full-load corners at minimum and nominal input.
      const powers = ['min-input/100pct-load', 'nominal-input/100pct-load'].map(
        (label) => fullLoadCorner(held.value, label).inputPowerW,
      );
      expectClose(block.inputPowerW, Math.max(...powers), { rel: 0 });
      // ref: common practice, conservation of energy: a lossy converter draws more than 12 V × 2 A
      expect(block.inputPowerW).toBeGreaterThan(24);
      // ref: common practice, energy = power × time
      expectClose(block.energyJ, block.inputPowerW * HOLD_UP_TIME_S, { rel: 1e-12 });
      // ref: common practice, ½·C·(V1² − V2²) = P·t (stored energy of a capacitor, ½·C·V²)
      expectClose(0.5 * block.bulkCapacitanceF * (48 ** 2 - 36 ** 2), block.energyJ, {
        rel: 1e-12,
      });
    });

    it(`designConverter(${topology} + holdUp) leaves every other part of the design unchanged`, () => {
      if (!plain.ok || !held.ok) return expect(held.ok).toBe(plain.ok);
      // Consistency check, no outside reference: hold-up adds a block and moves no number.
      const { holdUp, ...rest } = held.value;
      expect(holdUp).toBeDefined();
      expect(rest).toEqual(plain.value);
      expect('holdUp' in plain.value).toBe(false);
    });
  }

  it('designConverter(offline bus + holdUp with its own voltages) takes the largest full-load input power between them', () => {
    const spec = busSpec({ holdUp: { timeS: 0.02, startVoltageV: 375, endVoltageV: 200 } });
    const result = designConverter(spec);
    if (!result.ok) throw new Error(JSON.stringify(result.issues));
    const block = result.value.holdUp;
    if (!block) throw new Error('no holdUp block');
    expect(block.origins).toEqual({ startVoltageV: 'spec', endVoltageV: 'spec' });
    // Consistency check, no outside reference: the points are 200 V, the 325 V nominal corner
    // and 375 V, so the power is at least the nominal full-load corner's.
    expect([200, 325, 375]).toContain(block.inputPowerAtVoltageV);
    const nominal = fullLoadCorner(result.value, 'nominal-input/100pct-load');
    expect(block.inputPowerW).toBeGreaterThanOrEqual(nominal.inputPowerW);
    // ref: common practice, conservation of energy: a lossy converter draws more than 24 V × 1 A
    expect(block.inputPowerW).toBeGreaterThan(24);
    // ref: common practice, ½·C·(V1² − V2²) = P·t with V1 = 375 V, V2 = 200 V
    expectClose(block.bulkCapacitanceF, (2 * block.inputPowerW * 0.02) / (375 ** 2 - 200 ** 2), {
      rel: 1e-12,
    });
  });

  it('designConverter(holdUp beyond the spec load points) answers the power limit at the hold-up end', () => {
    // Invented scenario: 20 µH in discontinuous conduction, load points up to half load only.
    const base = telecomSpec({
      loadFractions: [0.25, 0.5],
      transformer: { turnsRatio: 2, magnetizingInductanceH: 20e-6 },
      limits: { dutyCycleMax: 0.25 },
    });
    expect(designConverter(base).ok).toBe(true);
    const result = designConverter({ ...base, holdUp: { timeS: HOLD_UP_TIME_S } });
    if (result.ok) throw new Error('expected the full-load hold-up point to fail');
    const issue = result.issues.find((item) => item.corner === 'hold-up-end/100pct-load');
    expect(issue?.code).toBe('dcm_power_limit');
    // ref: common practice, full load is 12 V × 2 A
    expectClose(issue?.required ?? NaN, 24, { rel: 1e-12 });
    // ref: common practice, a discontinuous flyback stores ½·Lm·Ipk² per cycle with
    // Ipk = Vin·D/(Lm·fs), so at most (Vin·D)²/(2·Lm·fs) = 20.25 W lossless from 36 V at D = 0.25;
    // losses take about a tenth of it at an efficiency near 0.9
    const losslessLimitW = (36 * 0.25) ** 2 / (2 * 20e-6 * 100e3);
    expect(issue?.limit).toBeLessThanOrEqual(losslessLimitW);
    expectClose(issue?.limit ?? NaN, losslessLimitW, { rel: 0.15 });
  });
});
