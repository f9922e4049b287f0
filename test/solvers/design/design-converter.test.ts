import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../solvers/design/design-converter.js';
import { DesignSchema, type FlybackDesign } from '../../../solvers/design/design-schema.js';
import { expectClose } from '../../helpers/expect-close.js';
import { busSpec, telecomSpec } from '../../helpers/flyback-specs.js';

function designed(spec: Parameters<typeof designConverter>[0]): FlybackDesign {
  const result = designConverter(spec);
  if (!result.ok) throw new Error(JSON.stringify(result.issues));
  if (result.value.topology !== 'flyback') throw new Error('expected a flyback design');
  return result.value;
}

describe('designConverter', () => {
  const spec = telecomSpec();
  const design = designed(spec);

  it('designConverter(spec) returns a design the schema accepts, with 3 × N corners in order', () => {
    // ref: spec contract, DesignSchema is the shape every client reads
    expect(DesignSchema.safeParse(design).success).toBe(true);
    // ref: common practice, every input extreme × every load point
    expect(design.corners.map((corner) => corner.label)).toEqual([
      'min-input/10pct-load',
      'min-input/50pct-load',
      'min-input/100pct-load',
      'nominal-input/10pct-load',
      'nominal-input/50pct-load',
      'nominal-input/100pct-load',
      'max-input/10pct-load',
      'max-input/50pct-load',
      'max-input/100pct-load',
    ]);
  });

  it('summarizes the worst case over the corners', () => {
    const { summary, corners } = design;
    const nominal = corners.find((corner) => corner.label === 'nominal-input/100pct-load');
    // ref: common practice, a design summary reports its worst corner
    expectClose(summary.dutyCycleMax, Math.max(...corners.map((corner) => corner.dutyCycle)), {
      rel: 0,
    });
    expectClose(summary.efficiencyMin, Math.min(...corners.map((corner) => corner.efficiency)), {
      rel: 0,
    });
    expectClose(summary.efficiencyNominal, nominal?.efficiency ?? NaN, { rel: 0 });
    expectClose(summary.lossTotalMaxW, Math.max(...corners.map((corner) => corner.lossTotalW)), {
      rel: 0,
    });
    // ref: common practice, the switch sees Vin,max + Vc at worst
    expectClose(summary.switchVoltagePeakV, 72 + design.choices.clampVoltageV, { rel: 1e-12 });
    expect(summary.conductionModes).toEqual(corners.map((corner) => corner.conductionMode));
  });

  it('balances energy at every corner of both invented scenarios', () => {
    for (const corner of [...design.corners, ...designed(busSpec()).corners]) {
      const lossW = corner.losses.reduce((sum, loss) => sum + loss.powerW, 0);
      // ref: common practice, conservation of energy
      expectClose(corner.inputPowerW, corner.outputPowerW + lossW, { rel: 1e-12 });
      expect(corner.efficiency > 0 && corner.efficiency < 1).toBe(true);
    }
  });

  it('returns the same numbers for the same spec', () => {
    // ref: common practice, a deterministic engine (DESIGN.md: same input, same numbers)
    expect(designed(telecomSpec())).toEqual(design);
  });

  it('states what the model leaves out', () => {
    const notes = design.modelNotes.join(' ');
    // ref: common practice, an estimate names its omissions
    for (const word of ['ringing', 'linear model', 'overlap', 'ambient temperature']) {
      expect(notes).toContain(word);
    }
    // With the transformer designed its core and AC copper losses are modelled: the notes say
    // how, and nowhere that they are not.
    expect(notes).toContain('Core loss by the iGSE');
    expect(notes).toContain('Dowell');
    expect(notes).not.toMatch(/not (yet )?modelled with the magnetics assumed/);
  });

  it('says which parts of the transformer the spec fixed, and the design keeps them', () => {
    const fixed = designed(telecomSpec({ magnetics: { coreShape: 'ETD 49', primaryTurns: 30 } }));
    const note = fixed.modelNotes.find((text) => text.startsWith('The transformer is designed'));
    // ref: common practice, an estimate states its own inputs: a design on a named core must not
    // read as the smallest core that fits
    expect(fixed.transformer?.coreShape).toBe('ETD 49');
    expect(fixed.transformer?.windings[0]?.turns).toBe(30);
    expect(note).toContain('the core shape the spec names (magnetics.coreShape, ETD 49)');
    expect(note).toContain('30 primary turns as the spec fixes them');
    expect(note).not.toContain('the smallest core shape');
    const free = design.modelNotes.find((text) => text.startsWith('The transformer is designed'));
    expect(free).toContain('the smallest core shape');
  });

  it('states, with the magnetics assumed, that core loss and AC winding resistance are left out', () => {
    const assumed = designed(telecomSpec({ magnetics: { mode: 'assume' } }));
    const notes = assumed.modelNotes.join(' ');
    // ref: common practice, an estimate names its omissions
    expect(notes).toContain('core loss, AC winding resistance');
    expect(notes).toContain('not modelled with the magnetics assumed');
    expect(notes).not.toContain('Core loss by the iGSE');
  });

  it('returns every issue of every corner, not just the first', () => {
    const result = designConverter(
      telecomSpec({
        clamp: { voltageV: 70 },
        primarySwitch: { onResistanceOhm: 0.05, voltageRatingV: 140 },
        transformer: { turnsRatio: 5, primaryResistanceOhm: 0.06 },
        limits: { dutyCycleMax: 0.6 },
      }),
    );
    if (result.ok) throw new Error('expected issues');
    const found = result.issues.map((issue) => `${issue.code}@${issue.corner}`);
    // ref: common practice, 72 V + 70 V exceeds 0.9 × 140 V at every maximum-input corner, and n =
    // 5 needs a duty cycle above 0.63 at 36 V (Erickson & Maksimović, 2nd ed. (from memory),
    // §6.3.4)
    expect(found).toEqual(
      expect.arrayContaining([
        'switch_voltage_rating@max-input/10pct-load',
        'switch_voltage_rating@max-input/50pct-load',
        'switch_voltage_rating@max-input/100pct-load',
        'duty_cycle_limit@min-input/100pct-load',
      ]),
    );
  });

  it('returns the choices issue when no choice can meet the spec', () => {
    const result = designConverter(telecomSpec({ targets: { dutyCycleTarget: 0.7 } }));
    // ref: spec contract, the target duty cycle must respect limits.dutyCycleMax
    expect(result.ok ? [] : result.issues.map((issue) => issue.code)).toEqual(['duty_cycle_limit']);
  });
});
