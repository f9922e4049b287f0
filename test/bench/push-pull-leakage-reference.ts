/**
 * An idealized time-stepped reference for the push-pull with leakage at light load (issue 3;
 * DEVELOPERS.md, "The push-pull's turn-on ring", examined since):
 * `npx tsx test/bench/push-pull-leakage-reference.ts [scenario] [--duty D ...] [--vo V]
 * [--periods P] [--clamp-v V | --no-clamp]`, the scenarios of `light-load-probe.ts` (default
 * `scan-push-pull-400`; its first load at its input corner). `--clamp-v`: the clamp's level
 * above the rail (default the design's clamp voltage).
 *
 * Not the engine and not a model of it: the circuit whose leakage the engine's light-load event
 * model leaves out of the push-pull's ring, stepped in time so that what it leaves out can be
 * measured without ngspice. Each primary half has its leakage Llk from the rail to the winding
 * and its switch's capacitance C from the drain to ground; the switch on holds its drain at
 * zero; off, the body diode holds the drain at zero and the clamp at the rail plus the clamp
 * voltage (an ideal level: the deck's RCD clamp floats to where its resistor takes the power);
 * an ideal transformer (Lm across half a; the winding voltage e) and a center-tapped secondary
 * with ideal rectifiers and the engine's drops at the current, the output inductor into a held
 * output voltage; no damping anywhere and no primary resistance. The winding voltage follows
 * from the transformer's current (ia − ib = Im + IL/n while a rectifier conducts, Im alone while
 * none does; e = 0 while both freewheel). RK4 at 0.25 ns for `--periods` periods (160 by
 * default: the undamped circuit settles over some 100), from the drains at 0 and 2·Vin and the
 * magnetizing current at its symmetric negative peak; the mean inductor current over the last
 * quarter.
 *
 * Prints one JSON line per duty cycle (default the engine's): the mean inductor current at the
 * held output (`--vo`, default the regulated one) against the load there. Checked against
 * ngspice (Debian): the probe's deck of the default scenario with 1000·√(Llk/C) across each
 * leakage (nearly undamped) and its clamp capacitor replaced by a source at 721 V (the level its
 * RC clamp settled at), output held at 12 V, 240 periods: 0.1607 and 0.4491 A at D = 0.03 and
 * 0.145, where this reference with `--clamp-v 721` gives 0.1591 and 0.4410 A (−1.0 %, −1.8 %).
 */
import {
  LIGHT_LOAD_SCENARIOS as SCENARIOS,
  flagNumbers,
  lightLoadCorner,
  type LightLoadScenario as Scenario,
} from './light-load-scenarios.js';

const STEP_S = 0.25e-9;

interface Circuit {
  inputV: number;
  leakageH: number;
  capacitanceF: number;
  magnetizingH: number;
  turnsRatio: number;
  inductanceH: number;
  periodS: number;
  clampV: number;
  /** Vo + the conducting path's drops at IL (A), V. */
  pathV: (il: number) => number;
  /** Vo + the freewheel's drops at IL (A), V. */
  freewheelV: (il: number) => number;
}

type Mode = 'a' | 'b' | 'freewheel' | 'off';
/** ia, ib (the leakage currents, rail to drain), va, vb (the drains), IL, Im (primary). */
type State = [number, number, number, number, number, number];

/** The winding voltage e of half a in `mode`, V. */
function windingV(k: Circuit, s: State, mode: Mode): number {
  const [, , va, vb, il] = s;
  const n = k.turnsRatio;
  const sum = 2 / k.leakageH + 1 / k.magnetizingH;
  if (mode === 'freewheel') return 0;
  if (mode === 'off') return (vb - va) / k.leakageH / sum;
  const sign = mode === 'a' ? 1 : -1;
  return (
    ((vb - va) / k.leakageH + (sign * k.pathV(il)) / (n * k.inductanceH)) /
    (sum + 1 / (n * n * k.inductanceH))
  );
}

function derivative(k: Circuit, s: State, mode: Mode, onA: boolean, onB: boolean): State {
  const [ia, ib, va, vb, il] = s;
  const n = k.turnsRatio;
  const e = windingV(k, s, mode);
  let dil = 0;
  if (mode === 'a') dil = (e / n - k.pathV(il)) / k.inductanceH;
  else if (mode === 'b') dil = (-e / n - k.pathV(il)) / k.inductanceH;
  else if (mode === 'freewheel') dil = -k.freewheelV(il) / k.inductanceH;
  return [
    (k.inputV - va - e) / k.leakageH,
    (k.inputV - vb + e) / k.leakageH,
    onA ? 0 : ia / k.capacitanceF,
    onB ? 0 : ib / k.capacitanceF,
    dil,
    e / k.magnetizingH,
  ];
}

function along(s: State, d: State, h: number): State {
  return s.map((v, i) => v + h * (d[i] as number)) as State;
}

/**
 * The rectifiers after a step: a conducting rectifier stops at zero current or hands over to the
 * freewheel as the winding reverses; the freewheel ends where the transformer's current takes
 * all of IL; with none conducting, one starts where the winding reaches the path's voltage.
 */
function nextMode(k: Circuit, s: State, mode: Mode): Mode {
  const n = k.turnsRatio;
  const e = windingV(k, s, mode);
  if (mode !== 'off' && s[4] <= 0) {
    s[4] = 0;
    return 'off';
  }
  if (mode === 'a') return e < 0 ? 'freewheel' : 'a';
  if (mode === 'b') return e > 0 ? 'freewheel' : 'b';
  if (mode === 'freewheel') {
    const referredA = n * (s[0] - s[1] - s[5]);
    return referredA >= s[4] ? 'a' : referredA <= -s[4] ? 'b' : 'freewheel';
  }
  return e / n > k.pathV(0) ? 'a' : -e / n > k.pathV(0) ? 'b' : 'off';
}

/** The mean inductor current (A) over the last quarter of `periods` periods at duty cycle `duty`. */
function meanInductorA(k: Circuit, duty: number, periods: number): number {
  const startImA = -(k.inputV * duty * k.periodS) / (2 * k.magnetizingH);
  let s: State = [0, 0, 0, 2 * k.inputV, 0, startImA];
  let mode: Mode = 'off';
  const steps = Math.round(k.periodS / STEP_S);
  const from = Math.floor(0.75 * periods) * steps;
  let sum = 0;
  let count = 0;
  for (let step = 0; step < periods * steps; step++) {
    const t = (step % steps) * STEP_S;
    const onA = t < duty * k.periodS;
    const onB = t >= k.periodS / 2 && t < (0.5 + duty) * k.periodS;
    if (onA) s[2] = 0;
    if (onB) s[3] = 0;
    const k1 = derivative(k, s, mode, onA, onB);
    const k2 = derivative(k, along(s, k1, STEP_S / 2), mode, onA, onB);
    const k3 = derivative(k, along(s, k2, STEP_S / 2), mode, onA, onB);
    const k4 = derivative(k, along(s, k3, STEP_S), mode, onA, onB);
    s = s.map(
      (v, i) =>
        v +
        (STEP_S / 6) *
          ((k1[i] as number) + 2 * (k2[i] as number) + 2 * (k3[i] as number) + (k4[i] as number)),
    ) as State;
    // An off drain: its body diode and the clamp hold it.
    if (!onA) s[2] = Math.min(Math.max(s[2], 0), k.clampV);
    if (!onB) s[3] = Math.min(Math.max(s[3], 0), k.clampV);
    mode = nextMode(k, s, mode);
    if (step >= from) {
      sum += s[4];
      count += 1;
    }
  }
  return sum / count;
}

const args = process.argv.slice(2);
const valuesOf = (flag: string): number[] => flagNumbers(args, flag);
const name = args[0] !== undefined && args[0] in SCENARIOS ? args[0] : 'scan-push-pull-400';
const scenario = SCENARIOS[name] as Scenario;
const load = scenario.loads[0] as number;
const { spec, design, corner, output, inputV } = lightLoadCorner(scenario, load, scenario.input);
if (design.topology !== 'push-pull') throw new Error(`${name} is not a push-pull`);
const choices = design.choices;
const rectifier = spec.outputs[0]?.rectifier;
if (rectifier?.kind !== 'diode') throw new Error(`${name}: diode rectifiers only`);
const forwardV = rectifier.forwardVoltageV;
const rectifierOhm = rectifier.resistanceOhm;
const windingOhm = choices.outputWindingResistancesOhm[0] ?? 0;
const inductorOhm = choices.outputInductorResistancesOhm[0] ?? 0;
const heldV = valuesOf('--vo')[0] ?? output.voltageV;
const clampAboveV = valuesOf('--clamp-v')[0] ?? choices.clampVoltageV ?? Infinity;
const circuit: Circuit = {
  inputV,
  leakageH: choices.leakageInductanceH,
  capacitanceF: spec.primarySwitch.outputCapacitanceF,
  magnetizingH: choices.magnetizingInductanceH,
  turnsRatio: choices.turnsRatio,
  inductanceH: choices.outputInductancesH[0] as number,
  periodS: 1 / spec.switchingFrequencyHz,
  clampV: args.includes('--no-clamp') ? Infinity : inputV + clampAboveV,
  pathV: (il) => heldV + forwardV + (rectifierOhm + windingOhm + inductorOhm) * il,
  // Both rectifiers share the current while freewheeling, each through its own winding half.
  freewheelV: (il) => heldV + forwardV + ((rectifierOhm + windingOhm) / 2 + inductorOhm) * il,
};
const periods = valuesOf('--periods')[0] ?? 160;
const duties = valuesOf('--duty');
for (const duty of duties.length > 0 ? duties : [corner.dutyCycle]) {
  console.log(
    JSON.stringify({
      scenario: name,
      corner: corner.label,
      dutyCycle: duty,
      heldV,
      clampV: Number.isFinite(circuit.clampV) ? circuit.clampV : 'none',
      meanInductorA: meanInductorA(circuit, duty, periods),
      loadA: (heldV / output.voltageV) * output.currentA,
    }),
  );
}
