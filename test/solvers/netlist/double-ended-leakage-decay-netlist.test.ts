import { beforeAll, describe, expect, it } from 'vitest';
import {
  designConverter,
  doubleEndedNetlist,
  type DoubleEndedDesign,
  type Spec,
} from '../../../solvers/index.js';
import {
  doubleEndedCircuit,
  doubleEndedStateAt,
  leakageKneeDuty,
  stateTurnOffA,
  type DoubleEndedState,
} from '../../../solvers/topologies/double-ended/double-ended-state.js';
import { primaryBridge } from '../../../solvers/topologies/double-ended/primary-bridge.js';
import { leakyLowInputBridgeSpec } from '../../helpers/double-ended-specs.js';
import { expectClose } from '../../helpers/expect-close.js';
import { runNgspice, type NgspiceRun } from '../../helpers/ngspice.js';
import { settledOutputV } from '../../helpers/settled-average.js';

/*
 * The bridges' leakage decay outlasting the off-time (issue 3; DEVELOPERS.md, "The leakage's
 * turn-off decay"). At turn-off the leakage carries the primary current on through the opposite
 * switches' body diodes at about Vd/Llk; at the lowest input, with 1 µH of leakage at 227 kHz and
 * D = 0.45, that takes some 0.45 µs against an off-time of 0.22 µs, and the next switches turn
 * on into the rest of it: the turn-on commutation starts from that rest. Invented scenarios
 * (`leakyLowInputBridgeSpec`): a half bridge on 36–72 V and a full bridge on 18–36 V (the same
 * 18 V of drive), 12 V 5.7 A, the converter's own Lm, full load at the lowest input. Past the
 * knee (the duty cycle at which the decay just fills the off-time) the output no longer rises
 * with D, so the regulated corner sits just below it (D about 0.40 for a target of 0.45); the
 * engine's own state past it, at D = 0.45 on the same design, is checked too, through a deck of
 * that state. Before (engine of 2026-12-04, its own designs and decks, D = 0.45): ngspice
 * −5.01 % (half bridge) and −4.93 % (full bridge) on the output, −4.41 % and −4.36 % on the
 * switch peak current.
 */

interface Case {
  name: string;
  spec: Spec;
  design: DoubleEndedDesign;
  /** The engine's state at D = 0.45, past the knee, at the lowest input and full load. */
  past: DoubleEndedState;
  /** The design with its lowest-input full-load corner moved to that state. */
  pastDesign: DoubleEndedDesign;
  knee: number;
}

const LABEL = 'min-input/100pct-load';
const PAST_DUTY = 0.45;

function leakyCase(topology: 'half-bridge' | 'full-bridge'): Case {
  const spec = leakyLowInputBridgeSpec(topology);
  const result = designConverter(spec);
  if (!result.ok || result.value.topology !== topology) {
    throw new Error(`invented scenario infeasible: ${JSON.stringify(result)}`);
  }
  const design = result.value;
  const corner = design.corners.find((k) => k.label === LABEL);
  if (corner === undefined) throw new Error(`no corner ${LABEL}`);
  const circuit = doubleEndedCircuit(spec, primaryBridge(topology), design.choices, {
    label: LABEL,
    inputVoltageV: corner.inputVoltageV,
    loadFraction: corner.loadFraction,
  });
  const past = doubleEndedStateAt(circuit, PAST_DUTY);
  const outputV = past.points[0]?.voltageV ?? NaN;
  // The deck reads the duty cycle, the output and its load, and its start values off the
  // corner: the same corner at D = 0.45 with the state's output (its load resistor Vo/Io).
  const pastCorner = {
    ...corner,
    dutyCycle: PAST_DUTY,
    outputs: corner.outputs.map((o) => ({ ...o, voltageV: outputV })),
  };
  const pastDesign = {
    ...design,
    corners: design.corners.map((k) => (k.label === LABEL ? pastCorner : k)),
  } as DoubleEndedDesign;
  return {
    name: `${topology}, ${spec.inputVoltageMinV} V, 1 µH`,
    spec,
    design,
    past,
    pastDesign,
    knee: leakageKneeDuty(circuit, stateTurnOffA(circuit, past)),
  };
}

const CASES = [leakyCase('half-bridge'), leakyCase('full-bridge')];
const runs = new Map<Case, { regulated: Promise<NgspiceRun>; past: Promise<NgspiceRun> }>();

beforeAll(async () => {
  // Some 3 s of ngspice each.
  for (const c of CASES) {
    const options = { cornerLabel: LABEL };
    runs.set(c, {
      regulated: runNgspice(doubleEndedNetlist(c.spec, c.design, options), { timeoutMs: 240_000 }),
      past: runNgspice(doubleEndedNetlist(c.spec, c.pastDesign, options), { timeoutMs: 240_000 }),
    });
  }
  await Promise.allSettled([...runs.values()].flatMap((r) => [r.regulated, r.past]));
}, 600_000);

describe('the bridges with a leakage decay that outlasts the off-time', () => {
  for (const c of CASES) {
    it(`ngspice agrees with the engine on the ${c.name} at full load, lowest input, held below the knee: output voltage and switch peak current`, async () => {
      const corner = c.design.corners.find((k) => k.label === LABEL);
      if (corner === undefined) throw new Error(`no corner ${LABEL}`);
      // The regulated corner sits below the knee, which lies below the target 0.45.
      expect(c.knee).toBeLessThan(PAST_DUTY - 0.02);
      expect(corner.dutyCycle).toBeLessThanOrEqual(c.knee);
      const m = (await (runs.get(c)?.regulated as Promise<NgspiceRun>)).measures;
      // ref: ngspice (Debian package), the same design simulated as a switched circuit; the
      // issue's agreement targets are 2 % on output voltage and 5 % on switch peaks. The windows
      // are taken as settled once the last moved under 0.1 % (the default 0.02 %): the full
      // bridge's deck wanders slowly about its average at this corner (eight windows of 0.62 ms
      // read 12.0017–12.0072 V, a cycle of some 3 ms; engine of 2026-12-05 with the leakage's
      // ring before turn-on), which is neither settled nor a geometric approach at 0.02 %.
      expectClose(settledOutputV(m, 1, { settledRel: 1e-3 }), corner.outputs[0]?.voltageV ?? NaN, {
        rel: 0.02,
      });
      expectClose(m.switch_current_peak_a ?? NaN, corner.switches[0]?.currentPeakA ?? NaN, {
        rel: 0.05,
      });
    });

    it(`ngspice agrees with the engine's state of the ${c.name} past the knee (D = 0.45, the turn-on into the decay's rest): output voltage and switch peak current`, async () => {
      // The engine's account: at turn-on the last half's leakage current is still flowing.
      expect(c.past.leakageCarryA ?? 0).toBeGreaterThan(1);
      const m = (await (runs.get(c)?.past as Promise<NgspiceRun>)).measures;
      // ref: ngspice (Debian package), the same design at that duty cycle, as above.
      expectClose(settledOutputV(m, 1), c.past.points[0]?.voltageV ?? NaN, { rel: 0.02 });
      // The switch's peak is the primary current at turn-off, Σ IL,pk/n + Im,pk.
      expectClose(m.switch_current_peak_a ?? NaN, stateTurnOffA(circuitOf(c), c.past), {
        rel: 0.05,
      });
    });
  }
});

function circuitOf(c: Case): ReturnType<typeof doubleEndedCircuit> {
  const corner = c.design.corners.find((k) => k.label === LABEL);
  if (corner === undefined) throw new Error(`no corner ${LABEL}`);
  return doubleEndedCircuit(c.spec, primaryBridge(c.design.topology), c.design.choices, {
    label: LABEL,
    inputVoltageV: corner.inputVoltageV,
    loadFraction: corner.loadFraction,
  });
}
