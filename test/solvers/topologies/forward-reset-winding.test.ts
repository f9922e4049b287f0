import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../solvers/design/design-converter.js';
import type { ResetWindingForwardDesign } from '../../../solvers/design/design-schema.js';
import type { Issue } from '../../../solvers/result.js';
import type { Spec } from '../../../solvers/spec/spec-schema.js';
import { forwardResetWinding } from '../../../solvers/topologies/forward-reset-winding.js';
import { topologyContract } from '../../contracts/topology-contract.js';
import { expectClose } from '../../helpers/expect-close.js';
import {
  forwardHighInputSpec,
  resetWindingSpec,
  twoOutputHighInputSpec,
} from '../../helpers/forward-specs.js';

function designed(spec: Spec): ResetWindingForwardDesign {
  const result = designConverter(spec);
  if (!result.ok) throw new Error(JSON.stringify(result.issues));
  if (result.value.topology !== 'forward-reset-winding')
    throw new Error('not a reset-winding forward');
  return result.value;
}

function issuesOf(spec: Spec): Issue[] {
  const result = designConverter(spec);
  if (result.ok) throw new Error('expected the spec to be infeasible');
  return result.issues;
}

const LOSSLESS = {
  outputs: [
    {
      voltageV: 12,
      currentA: 8,
      rectifier: { kind: 'diode' as const, forwardVoltageV: 0, resistanceOhm: 0 },
      windingResistanceOhm: 0,
      inductorResistanceOhm: 0,
      capacitorEsrOhm: 0,
    },
  ],
  // Ideal switch: no capacitance, so no turn-off swing.
  primarySwitch: { onResistanceOhm: 1e-9, voltageRatingV: 250, outputCapacitanceF: 0 },
  transformer: { primaryResistanceOhm: 0, leakageInductanceH: 0 },
  primaryClampDiode: { forwardVoltageV: 0 },
};

topologyContract(forwardResetWinding, [
  { name: 'invented 36-72 V to 12 V 8 A, Nr/Np = 1', spec: resetWindingSpec(1) },
  {
    name: 'invented 36-72 V to 12 V 8 A, Nr/Np = 0.8, D target 0.5',
    spec: resetWindingSpec(0.8, { targets: { dutyCycleTarget: 0.5 } }),
  },
  {
    // The light-load event period with two outputs (the second cross-regulating).
    name: 'invented 200-400 V to 12 V 5 A plus 5 V 2 A, 2-10 % load',
    spec: twoOutputHighInputSpec('forward-reset-winding', { loadFractions: [0.02, 0.05, 0.1, 1] }),
  },
]);

describe('forwardResetWinding (lossless)', () => {
  for (const ratio of [1, 0.8, 1.2]) {
    const design = designed(resetWindingSpec(ratio, LOSSLESS));
    it(`designConverter(Nr/Np = ${ratio}) resets in Dr = D·Nr/Np and blocks Vin·(1 + Np/Nr)`, () => {
      // Consistency check, no outside reference: the design keeps the ratio the spec fixed.
      expectClose(design.choices.resetTurnsRatio, ratio, { rel: 0 });
      for (const corner of design.corners) {
        // ref: Mohan, Undeland, Robbins, 3rd ed., §10-4-1 (from memory): volt-second balance
        // Vin·D = (Np/Nr)·Vin·Dr on the magnetizing inductance
        expectClose(corner.resetDutyCycle, corner.dutyCycle * ratio, { rel: 1e-6 });
        // ref: Mohan, Undeland, Robbins, 3rd ed., §10-4-1 (from memory): the switch blocks
        // Vin·(1 + Np/Nr) during reset
        expectClose(
          corner.switches[0]?.voltagePeakV ?? NaN,
          corner.inputVoltageV * (1 + 1 / ratio),
          {
            rel: 1e-9,
          },
        );
        expect(corner.switches).toHaveLength(1);
        if (corner.outputInductorModes[0] !== 'ccm') continue;
        // ref: Mohan, Undeland, Robbins, 3rd ed., §10-4-1 (from memory): Vo = D·Vin·Ns/Np
        expectClose(12, (corner.dutyCycle * corner.inputVoltageV) / design.choices.turnsRatio, {
          rel: 1e-6,
        });
      }
    });
  }
});

describe('forwardResetWinding (limits)', () => {
  it('limits the duty cycle to 1/(1 + Nr/Np), with numbers, for a fixed turns ratio', () => {
    // Nr/Np = 1.5 gives a limit of 0.4; turns ratio 1.5 needs about 1.5·12.5/36 ≈ 0.52 at 36 V.
    const issues = issuesOf(resetWindingSpec(1.5, { transformer: { turnsRatio: 1.5 } }));
    const duty = issues.find(
      (i) => i.code === 'duty_cycle_limit' && i.corner === 'min-input/100pct-load',
    );
    // ref: Mohan, Undeland, Robbins, 3rd ed., §10-4-1 (from memory): D ≤ 1/(1 + Nr/Np)
    expectClose(duty?.limit ?? NaN, 1 / 2.5, { rel: 1e-12 });
    expect(duty?.required ?? NaN).toBeGreaterThan((1.5 * 12.5) / 36);
  });

  it('checks the forward rectifier against the clamped reset, where the steady ring stops short of it', () => {
    // Invented 200-400 V to 12 V 5 A, Nr/Np = 0.8, the converter's own Lm: at 400 V the ring
    // of Lm with the drain capacitance peaks below the clamp (forward rectifier ~39 V, under the
    // freewheel's Vin/n ~55 V), but a load step or the start-up reaches the clamp.
    const [output] = forwardHighInputSpec('forward-reset-winding').outputs;
    if (output === undefined) throw new Error('the scenario has an output');
    const spec = forwardHighInputSpec('forward-reset-winding', {
      forward: { resetTurnsRatio: 0.8 },
      transformer: { leakageInductanceH: 0, turnsRatio: 7 },
      outputs: [{ ...output, rectifier: { ...output.rectifier, voltageRatingV: 70 } }],
    });
    const result = designConverter(spec);
    if (result.ok) throw new Error('expected the 70 V rectifier to be refused');
    const rating = result.issues.find(
      (i) => i.code === 'rectifier_voltage_rating' && i.corner === 'max-input/100pct-load',
    );
    // ref: common practice (from memory), during reset a forward's rectifier blocks the reset
    // winding's voltage (Vin + Vf)·Np/Nr over the turns ratio (7 here); 0.9 of the rating allowed
    expectClose(rating?.required ?? NaN, (400 + 0.8) / 0.8 / 7, { rel: 1e-9 });
    expectClose(rating?.limit ?? NaN, 63, { rel: 1e-12 });
  });

  it('refuses a switch rated below Vin·(1 + Np/Nr), naming its rating', () => {
    const issues = issuesOf(
      resetWindingSpec(1, { primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 150 } }),
    );
    const rating = issues.find(
      (i) => i.code === 'switch_voltage_rating' && i.corner === 'max-input/100pct-load',
    );
    // ref: common practice, a reset winding with Nr = Np doubles the switch voltage (plus the
    // reset diode drop), against 0.9 of the rating
    expectClose(rating?.required ?? NaN, 72 + 72.8, { rel: 1e-12 });
    expectClose(rating?.limit ?? NaN, 135, { rel: 1e-12 });
  });
});
