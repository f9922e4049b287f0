/**
 * An idealized time-stepped reference for the double-ended light-load gap (issue 3):
 * `npx tsx test/bench/light-load-reference.ts [scenario] [load ...] [--duty D] [--input
 * min|nominal|max] [--scan D0 D1 steps] [--exact] [--solve]`, the scenarios of
 * `light-load-probe.ts`.
 * `--exact` takes each half by exact stretches (`light-load-events.ts`) instead of time steps,
 * and prints its events and CPU time per half; `--solve` instead solves the duty cycle and the
 * turn-on currents together at the engine's Vo (`eventDutyForLoad`) and prints its Newton
 * steps, halves and time.
 *
 * Not the engine and not a model of it: the circuit the engine's light-load model simplifies,
 * stepped in time on the secondary with nothing left out of the switching sequence, so that
 * what the engine leaves out can be measured without ngspice. Lr = Lm/n² across the winding, the
 * switch-node capacitance Cr = C·n² (C as the engine's `nodeCapacitanceF`), the drive voltage
 * Vs = Vd/n forced on the winding during each on-time and the body diodes clamping it at ±Vs
 * otherwise, ideal rectifiers with the engine's drops at the load current (`secondaryStage`),
 * the output inductor into a held output voltage, no leakage, no losses in the ring, and no
 * primary resistance (the drive is Vd/n: negligible at light load; at 30–50 % load it puts the
 * duty cycle for the load 0.1–0.2 % (bridges) to 0.6–1.0 % (the 24 V push-pull) below the
 * engine's, most likely for that reason; not checked). Every
 * stretch the engine approximates runs as the circuit runs it: the turn-off swing (the winding
 * discharged by IL + n·Im from the drive voltage), the freewheel (the winding held at zero while
 * IL ≥ |n·Im|), the ring of Cr with L‖Lr and with Lr alone, its clamp, every rectifier coming
 * back into conduction, and the ring left at the next turn-on (no damping anywhere). Halves are
 * stepped (semi-implicit Euler, at least 200 steps a ring period and 40,000 a half) from rest,
 * each mirrored into the next, until the mean inductor current over a half settles (1e-6 of
 * itself over 20 halves).
 *
 * Prints one JSON line per load: the engine's duty cycle and output voltage, the reference's mean
 * inductor current at the engine's Vo and duty cycle (against the load), the output voltage at
 * which it delivers the load at the engine's duty cycle (compare the probe's settled output:
 * ngspice with the output held), and the duty cycle at which it delivers the load at the engine's
 * Vo. With `--scan`, the mean inductor current at the engine's Vo over a range of duty cycles (to
 * look for folds of Vo(D), DEVELOPERS.md item (iv)).
 */
import type { DoubleEndedDesign, Spec } from '../../solvers/index.js';
import { rectifierModel } from '../../solvers/devices/rectifier-model.js';
import { secondaryStage } from '../../solvers/topologies/double-ended/secondary-stage.js';
import { brentRoot } from '../../solvers/root-finding/brent-root.js';
import {
  LIGHT_LOAD_SCENARIOS,
  lightLoadCorner as cornerOf,
  type LightLoadScenario,
} from './light-load-scenarios.js';
import {
  eventDutyForLoad,
  eventMeanInductorA,
  type LightLoadCircuit,
} from './light-load-events.js';

type ReferenceCircuit = LightLoadCircuit;

function referenceCircuit(
  spec: Spec,
  design: DoubleEndedDesign,
  inputV: number,
  loadA: number,
): ReferenceCircuit {
  const { choices } = design;
  const n = choices.outputTurnsRatios[0] ?? choices.turnsRatio;
  const output = spec.outputs[0];
  if (output === undefined) throw new Error('no output');
  const stage = secondaryStage(choices.secondaryArrangements[0] ?? 'center-tapped', {
    loadA,
    inductanceH: choices.outputInductancesH[0] ?? NaN,
    inductorResistanceOhm: choices.outputInductorResistancesOhm[0] ?? 0,
    windingResistanceOhm: choices.outputWindingResistancesOhm[0] ?? 0,
    rectifier: rectifierModel(output.rectifier),
  });
  const free = stage.freewheel ?? stage.rectifier;
  const rl = stage.inductorResistanceOhm;
  // As the engine's `double-ended-state` and `primary-bridge`: the half bridge drives Vin/2; the
  // node capacitance is 2·Coss (push-pull, half bridge) or Coss (full bridge's legs in series).
  const driveV = design.topology === 'half-bridge' ? inputV / 2 : inputV;
  const nodeF = (design.topology === 'full-bridge' ? 1 : 2) * spec.primarySwitch.outputCapacitanceF;
  return {
    driveV: driveV / n,
    referredMagnetizingH: choices.magnetizingInductanceH / (n * n),
    inductanceH: stage.inductanceH,
    capacitanceF: nodeF * n * n,
    onDropV:
      stage.rectifier.forwardVoltageV +
      (stage.windingResistanceOhm + stage.rectifier.resistanceOhm + rl) * loadA,
    offDropV: free.forwardVoltageV + (free.resistanceOhm + rl) * loadA,
    halfS: 1 / spec.switchingFrequencyHz / 2,
  };
}

/**
 * The settled mean inductor current over a half, A, at per-switch duty cycle `duty` (the on-time
 * is duty·T = 2·duty·Th) with the output held at `outputV`.
 */
function steppedMeanInductorA(c: ReferenceCircuit, duty: number, outputV: number): number {
  const lr = c.referredMagnetizingH;
  const l = c.inductanceH;
  const cr = c.capacitanceF;
  const vs = c.driveV;
  const vj = outputV + c.onDropV;
  const voff = outputV + c.offDropV;
  const ringS = 2 * Math.PI * Math.sqrt(((l * lr) / (l + lr)) * cr);
  const steps = Math.max(40_000, Math.ceil((200 * c.halfS) / ringS));
  const dt = c.halfS / steps;
  const onSteps = Math.round((2 * duty * c.halfS) / dt);
  // The half's frame: w > 0 is the polarity just driven; path a conducts for w > 0.
  let w = 0;
  let im = 0;
  let il = 0;
  const means: number[] = [];
  for (let half = 0; half < 4000; half++) {
    let chargeAS = 0;
    for (let step = 0; step < steps; step++) {
      if (step < onSteps) {
        w = vs;
        im += (vs / lr) * dt;
        il = Math.max(0, il + ((vs - vj) / l) * dt);
      } else if (il > 0 && Math.abs(im) <= il && Math.abs(w) <= 1e-9 * vs) {
        // Freewheel: both paths conduct, (IL ∓ n·Im)/2 each, the winding held at zero.
        w = 0;
        il = Math.max(0, il - (voff / l) * dt);
      } else {
        // One path (the one the winding's polarity forward-biases) or none; Cr carries the rest.
        let pathA = 0;
        let pathB = 0;
        let ilRateAPerS = 0;
        if (il > 0) {
          if (w > 0 || (w === 0 && im < 0)) {
            pathA = il;
            ilRateAPerS = (w - vj) / l;
          } else {
            pathB = il;
            ilRateAPerS = (-w - vj) / l;
          }
        } else if (w > vj) {
          ilRateAPerS = (w - vj) / l;
        } else if (-w > vj) {
          ilRateAPerS = (-w - vj) / l;
        }
        let next = w + ((-im - pathA + pathB) / cr) * dt;
        // The body diodes clamp the winding at ±Vs.
        if (next > vs) next = vs;
        if (next < -vs) next = -vs;
        // Crossing zero with IL able to carry the magnetizing current: the freewheel begins.
        if (il > 0 && w * next < 0 && Math.abs(im) <= il) next = 0;
        w = next;
        im += (w / lr) * dt;
        il = Math.max(0, il + ilRateAPerS * dt);
      }
      chargeAS += il * dt;
    }
    // The next half mirrors this one: the other polarity is driven.
    w = -w;
    im = -im;
    means.push(chargeAS / c.halfS);
    if (means.length > 20) {
      const recent = means.slice(-20);
      const spread = Math.max(...recent) - Math.min(...recent);
      if (spread <= 1e-6 * Math.abs(recent[19] ?? 0)) break;
    }
  }
  const recent = means.slice(-20);
  return recent.reduce((a, b) => a + b, 0) / recent.length;
}

const args = process.argv.slice(2);
const flag = (name: string, count: number) => {
  const at = args.indexOf(name);
  if (at < 0) return undefined;
  const values = args.slice(at + 1, at + 1 + count);
  args.splice(at, count + 1);
  return values;
};
const dutyArg = flag('--duty', 1);
const inputArg = flag('--input', 1)?.[0] as LightLoadScenario['input'] | undefined;
const scanArg = flag('--scan', 3)?.map(Number);
const isExact = flag('--exact', 0) !== undefined;
const isSolve = flag('--solve', 0) !== undefined;
let exactHalves = 0;
let exactEvents = 0;
let exactMs = 0;
/** The settled mean inductor current, A: time-stepped, or by exact stretches with `--exact`. */
function meanInductorA(c: ReferenceCircuit, duty: number, outputV: number): number {
  if (!isExact) return steppedMeanInductorA(c, duty, outputV);
  const startMs = performance.now();
  const run = eventMeanInductorA(c, duty, outputV);
  exactMs += performance.now() - startMs;
  exactHalves += run.halves;
  exactEvents += run.events;
  return run.meanA;
}
const name = args[0] !== undefined && args[0] in LIGHT_LOAD_SCENARIOS ? args[0] : 'full-bridge';
const scenario = LIGHT_LOAD_SCENARIOS[name] as LightLoadScenario;
const loads = args.filter((a) => !(a in LIGHT_LOAD_SCENARIOS)).map(Number);
for (const load of loads.length > 0 ? loads : scenario.loads) {
  const input = inputArg ?? scenario.input;
  const { spec, design, corner, output, inputV } = cornerOf(scenario, load, input);
  const duty = dutyArg === undefined ? corner.dutyCycle : Number(dutyArg[0]);
  const loadOhm = output.voltageV / output.currentA;
  const circuit = referenceCircuit(spec, design, inputV, output.currentA);
  if (isSolve) {
    // The corner's own problem: D and the turn-on currents at the engine's Vo (exact stretches),
    // from the engine's duty cycle and rest; the median of 20 timed solves after a first.
    let solved = eventDutyForLoad(circuit, output.voltageV, output.currentA, corner.dutyCycle);
    const times: number[] = [];
    for (let round = 0; round < 20; round++) {
      const startMs = performance.now();
      solved = eventDutyForLoad(circuit, output.voltageV, output.currentA, corner.dutyCycle);
      times.push(performance.now() - startMs);
    }
    const ms = times.sort((x, y) => x - y)[10] ?? NaN;
    console.log(
      JSON.stringify({
        scenario: name,
        input,
        load,
        engineDuty: corner.dutyCycle,
        solvedDuty: solved.duty,
        newtonSteps: solved.steps,
        halves: solved.halves,
        microseconds: 1000 * ms,
      }),
    );
    continue;
  }
  if (scanArg !== undefined) {
    const [from = 0, to = 0, count = 1] = scanArg;
    for (let i = 0; i <= count; i++) {
      const d = from + ((to - from) * i) / count;
      const meanA = meanInductorA(circuit, d, output.voltageV);
      console.log(JSON.stringify({ scenario: name, input, load, dutyCycle: d, meanA }));
    }
    continue;
  }
  const meanA = meanInductorA(circuit, duty, output.voltageV);
  const settledV = brentRoot(
    (v) => meanInductorA(circuit, duty, v) - v / loadOhm,
    0.5 * output.voltageV,
    Math.min(1.5 * output.voltageV, circuit.driveV - circuit.onDropV),
    { absoluteTolerance: 1e-4 * output.voltageV },
  );
  const dutyForLoad = brentRoot(
    (d) => meanInductorA(circuit, d, output.voltageV) - output.currentA,
    0.2 * corner.dutyCycle,
    Math.min(0.5, 1.5 * corner.dutyCycle),
    { absoluteTolerance: 1e-5 },
  );
  console.log(
    JSON.stringify({
      scenario: name,
      input,
      load,
      corner: corner.label,
      engineDuty: corner.dutyCycle,
      engineV: output.voltageV,
      loadA: output.currentA,
      duty,
      referenceMeanA: meanA,
      referenceSettledV: settledV,
      referenceAgainstEnginePct: 100 * (settledV / output.voltageV - 1),
      referenceDutyForLoad: dutyForLoad,
      ...(isExact
        ? {
            method: 'exact',
            eventsPerHalf: exactEvents / exactHalves,
            microsecondsPerHalf: (1000 * exactMs) / exactHalves,
          }
        : { method: 'stepped' }),
    }),
  );
}
