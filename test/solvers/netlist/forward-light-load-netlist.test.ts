import { beforeAll, describe, expect, it } from 'vitest';
import { designConverter, designNetlist, type Spec } from '../../../solvers/index.js';
import { expectClose } from '../../helpers/expect-close.js';
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
  await Promise.allSettled([...runs.values()].map((r) => r.run));
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
