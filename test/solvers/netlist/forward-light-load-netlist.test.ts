import { beforeAll, describe, expect, it } from 'vitest';
import { designConverter, designNetlist, SpecSchema, type Spec } from '../../../solvers/index.js';
import { expectClose, expectSwitchPeaksClose } from '../../helpers/expect-close.js';
import { twoOutputForwardSpec } from '../../helpers/forward-specs.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { settledOutputV } from '../../helpers/settled-average.js';

// The forward family with two outputs at 10 % load, both output inductors discontinuous, against
// ngspice. Until the netlists gave their rectifier snubbers 1 pF where an inductor runs
// discontinuous (they had 10 Ω + 100 pF everywhere), the inductor rang with those 2 × 100 pF once
// its current stopped, a capacitance the design does not hold, and ngspice ran above the engine:
// the reset-winding forward +2.0 %/+2.3 % and the active clamp +2.4 %/+2.0 % on the two outputs
// at the lowest input, where they now agree within 0.6 %.

const CASES = (
  ['two-switch-forward', 'forward-reset-winding', 'active-clamp-forward'] as const
).flatMap((topology) =>
  ['min-input/10pct-load', 'max-input/10pct-load'].map((corner) => ({
    topology,
    corner,
  })),
);

interface Run {
  spec: Spec;
  design: Extract<ReturnType<typeof designConverter>, { ok: true }>['value'];
  run: Promise<NgspiceRun>;
}

const runs = new Map<(typeof CASES)[number], Run>();

/*
 * The inductors continuous but their referred valley below the magnetizing current the ring's
 * return leaves circulating (light-load-state.ts, `eventPeriodApplies`): the audit's two forwards
 * of `ngspice-scan.ts --seed 53 --input high` (specs 13 and 12; DEVELOPERS.md, "The ngspice
 * check", audit5) in round numbers, invented: 200–400 V, 12 V and 5 V outputs, at 400 V. With the
 * plain continuous model there (the engine before) ngspice read the two-switch forward's outputs
 * +8.35 % and +8.91 % and its switch current +4.49 %, and the reset-winding forward's outputs
 * +1.44 % and +1.58 % and its switch current −8.55 %; with the event period within 0.3 %.
 */
const DIODE = { kind: 'diode', forwardVoltageV: 0.5, resistanceOhm: 0.01, voltageRatingV: 100 };
const valleyCase = (
  topology: 'two-switch-forward' | 'forward-reset-winding',
  switchingFrequencyHz: number,
  load: number,
  currentsA: readonly [number, number],
  leakageInductanceH: number,
): Spec =>
  SpecSchema.parse({
    topology,
    inputVoltageMinV: 200,
    inputVoltageNominalV: 300,
    inputVoltageMaxV: 400,
    outputs: [
      { voltageV: 12, currentA: currentsA[0], capacitanceF: 100e-6, rectifier: DIODE },
      { voltageV: 5, currentA: currentsA[1], capacitanceF: 100e-6, rectifier: DIODE },
    ],
    switchingFrequencyHz,
    primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 1200 },
    loadFractions: [load, 1],
    magnetics: { mode: 'assume' },
    transformer: { leakageInductanceH },
  });
const VALLEY_CASES = [
  {
    name: 'two-switch forward, 2 µH, 183 kHz, 400 V 15 % load',
    spec: valleyCase('two-switch-forward', 183e3, 0.15, [4.6, 1.5], 2e-6),
    corner: 'max-input/15pct-load',
  },
  {
    name: 'reset-winding forward, 300 kHz, 400 V 17 % load',
    spec: valleyCase('forward-reset-winding', 300e3, 0.17, [4.7, 2.8], 0),
    corner: 'max-input/17pct-load',
  },
] as const;
const valleyRuns = new Map<(typeof VALLEY_CASES)[number], Run>();

beforeAll(async () => {
  for (const c of CASES) {
    const spec = twoOutputForwardSpec(c.topology);
    const result = designConverter(spec);
    if (!result.ok)
      throw new Error(`invented scenario infeasible: ${JSON.stringify(result.issues)}`);
    const netlist = designNetlist(spec, result.value, { cornerLabel: c.corner });
    // About 5 s each alone here.
    runs.set(c, { spec, design: result.value, run: runNgspice(netlist, { timeoutMs: 240_000 }) });
  }
  for (const c of VALLEY_CASES) {
    const result = designConverter(c.spec);
    if (!result.ok)
      throw new Error(`invented scenario infeasible: ${JSON.stringify(result.issues)}`);
    const netlist = designNetlist(c.spec, result.value, { cornerLabel: c.corner });
    valleyRuns.set(c, {
      spec: c.spec,
      design: result.value,
      run: runNgspice(netlist, { timeoutMs: 240_000 }),
    });
  }
  await Promise.allSettled([...runs.values(), ...valleyRuns.values()].map((r) => r.run));
}, 300_000);

describe('forward netlists with two outputs at light load', () => {
  for (const c of CASES) {
    it(`ngspice agrees with the engine on both outputs of the ${c.topology} at ${c.corner}`, async () => {
      const { design, run } = runs.get(c) as Run;
      const corner = design.corners.find((k) => k.label === c.corner);
      if (corner === undefined || !('outputInductorModes' in corner)) throw new Error('no corner');
      expect(corner.outputInductorModes).toEqual(['dcm', 'dcm']);
      const m = (await run).measures;
      corner.outputs.forEach((output, k) => {
        const simulatedV = settledOutputV(m, k + 1);
        // ref: ngspice (Debian package), the same design simulated as a switched circuit; the
        // issue's agreement target is 2 % on output voltage
        expectClose(simulatedV, output.voltageV, { rel: 0.02 });
      });
    });
  }
});

describe('forward netlists with the inductors’ valley below the circulating magnetizing current', () => {
  for (const c of VALLEY_CASES) {
    it(`ngspice agrees with the engine on the ${c.name}: both outputs, switch peaks`, async () => {
      const { design, run } = valleyRuns.get(c) as Run;
      const corner = design.corners.find((k) => k.label === c.corner);
      if (corner === undefined || !('switches' in corner)) throw new Error('no corner');
      // No fallback: the event period solved it.
      expect(corner.modelFallback).toBeUndefined();
      const m = (await run).measures;
      corner.outputs.forEach((output, k) => {
        // ref: ngspice (Debian package), the same design simulated as a switched circuit; the
        // issue's agreement targets are 2 % on output voltage and 5 % on the switch peaks
        expectClose(settledOutputV(m, k + 1), output.voltageV, { rel: 0.02 });
      });
      expectSwitchPeaksClose(m, corner.switches[0]);
    });
  }
});
