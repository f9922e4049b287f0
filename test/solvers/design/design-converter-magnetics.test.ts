import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../solvers/design/design-converter.js';
import type { FlybackDesign } from '../../../solvers/design/design-schema.js';
import { copperResistance } from '../../../solvers/materials/copper-resistance.js';
import { SpecSchema } from '../../../solvers/spec/spec-schema.js';
import { expectClose } from '../../helpers/expect-close.js';
import { telecomSpec } from '../../helpers/flyback-specs.js';

function designed(spec: Parameters<typeof designConverter>[0]): FlybackDesign {
  const result = designConverter(spec);
  if (!result.ok) throw new Error(JSON.stringify(result.issues));
  if (result.value.topology !== 'flyback') throw new Error('expected a flyback design');
  return result.value;
}

describe('designConverter with the magnetics design', () => {
  const spec = telecomSpec();
  const design = designed(spec);
  const transformer = design.transformer;
  if (transformer === undefined) throw new Error('the default design carries a transformer');

  // ref: common practice — a wound transformer's ratio is a ratio of whole turns.
  it('designConverter(flyback) solves with the whole-turns ratio of the wound transformer', () => {
    const [primary, secondary] = transformer.windings;
    if (primary === undefined || secondary === undefined) throw new Error('two windings');
    expect(Number.isInteger(primary.turns) && Number.isInteger(secondary.turns)).toBe(true);
    expectClose(design.choices.turnsRatio, primary.turns / secondary.turns, { rel: 1e-12 });
    expect(design.choices.origins.turnsRatio).toBe('magnetics');
    expect(design.choices.origins.leakageInductanceH).toBe('magnetics');
    expectClose(design.choices.leakageInductanceH, transformer.leakageInductanceH, { rel: 1e-12 });
  });

  // ref: IEC 60028 — R(T) = R20·(1 + 0.00393·(T − 20)); the operating point takes the windings
  // at the hottest corner's temperature, as found before the second solve (the re-evaluated
  // temperatures differ by a fraction of a kelvin, hence 1e-3).
  it('designConverter(flyback) takes the winding resistance at the hottest corner', () => {
    const hottestC = Math.max(...transformer.corners.map((corner) => corner.temperatureC));
    const r20 = transformer.windings[0]?.resistanceAt20COhm ?? NaN;
    expectClose(design.choices.primaryResistanceOhm, copperResistance(r20, hottestC), {
      rel: 1e-3,
    });
  });

  // ref: common practice — conservation of energy: the transformer's core and AC copper loss
  // are supplied by the input, and the budget lists them.
  it('designConverter(flyback) puts the transformer losses into every corner budget', () => {
    design.corners.forEach((corner, index) => {
      const magnetics = transformer.corners[index];
      if (magnetics === undefined) throw new Error(`no transformer corner ${index}`);
      const core = corner.losses.find((loss) => loss.mechanism === 'core');
      expectClose(core?.powerW ?? NaN, magnetics.coreLossW, { rel: 1e-12 });
      const primary = corner.losses.find(
        (loss) => loss.component === 'primary' && loss.mechanism === 'copper',
      );
      const w = magnetics.windings[0];
      expectClose(primary?.powerW ?? NaN, (w?.dcLossW ?? 0) + (w?.acLossW ?? 0), { rel: 1e-12 });
      const sum = corner.losses.reduce((total, loss) => total + loss.powerW, 0);
      expectClose(corner.lossTotalW, sum, { rel: 1e-12 });
      expectClose(corner.inputPowerW, corner.outputPowerW + sum, { rel: 1e-12 });
      expectClose(corner.efficiency, corner.outputPowerW / corner.inputPowerW, { rel: 1e-12 });
    });
  });

  // ref: common practice — the transformer respects the limits the spec holds it to.
  it('designConverter(flyback) keeps the transformer inside its fill, flux and rise limits', () => {
    expect(transformer.windowFill).toBeLessThanOrEqual(spec.magnetics.windowFillMax);
    expect(transformer.summary.fluxDensityUtilizationMax).toBeLessThanOrEqual(
      spec.magnetics.fluxDensityUtilizationMax,
    );
    expect(transformer.summary.temperatureRiseMaxK).toBeLessThanOrEqual(
      spec.magnetics.temperatureRiseMaxK,
    );
  });

  // Consistency check: 'assume' is the converter model alone, without a transformer.
  it('designConverter(mode assume) carries no transformer and keeps the spec resistances', () => {
    const assumed = designed(telecomSpec({ magnetics: { mode: 'assume' } }));
    expect(assumed.transformer).toBeUndefined();
    expectClose(assumed.choices.primaryResistanceOhm, copperResistance(0.06, 25), { rel: 1e-12 });
    expect(assumed.corners[0]?.losses.some((loss) => loss.mechanism === 'core')).toBe(false);
  });

  // ref: common practice — a core far too small for the power cannot carry it; the answer
  // names the limit it breaks with numbers.
  it('designConverter(fixed tiny ring) answers with the transformer limit it breaks', () => {
    const result = designConverter(
      SpecSchema.parse({
        ...telecomSpec(),
        outputs: [{ ...telecomSpec().outputs[0], currentA: 8 }],
        magnetics: { coreShape: 'R 12.5/7.5/5' },
      }),
    );
    expect(result.ok).toBe(false);
    if (result.ok) return;
    for (const issue of result.issues) {
      expect([
        'window_fill_limit',
        'flux_density_limit',
        'temperature_rise_limit',
        'non_physical_value',
      ]).toContain(issue.code);
    }
  });

  // ref: common practice — the hot-spot limit binds like the others: the default design's
  // hot spot lies under the 120 °C default, each corner reports it above its surface
  // temperature, and a limit at the ambient (no wound core can be that cool) is refused with
  // hot_spot_limit at magnetics.
  it('designConverter holds the winding hot spot to magnetics.hotSpotTemperatureMaxC', () => {
    expect(transformer.summary.hotSpotTemperatureMaxC).toBeLessThanOrEqual(120);
    for (const corner of transformer.corners) {
      expect(corner.hotSpotRiseK).toBeGreaterThan(0);
      expectClose(corner.hotSpotTemperatureC, corner.temperatureC + corner.hotSpotRiseK, {
        rel: 1e-12,
      });
    }
    const base = telecomSpec();
    const result = designConverter(
      SpecSchema.parse({
        ...base,
        magnetics: { hotSpotTemperatureMaxC: base.ambientTemperatureC },
      }),
    );
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.issues.some((issue) => issue.code === 'hot_spot_limit')).toBe(true);
  });

  // ref: common practice — a PQ pair named in the spec is wound and evaluated like any shape.
  it('designConverter(magnetics.coreShape PQ 26/20) designs on that PQ pair', () => {
    const pq = designed(
      SpecSchema.parse({ ...telecomSpec(), magnetics: { coreShape: 'PQ 26/20' } }),
    );
    expect(pq.transformer?.coreShape).toBe('PQ 26/20');
    expect(pq.transformer?.windowFill).toBeLessThanOrEqual(0.5);
  });
});
