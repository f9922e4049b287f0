import type { DoubleEndedDesign } from '../design/design-schema.js';
import type { Spec } from '../spec/spec-schema.js';
import { doubleEndedOutputLines } from './double-ended-output-lines.js';
import { doubleEndedPrimaryLines } from './double-ended-primary-lines.js';
import { deckTimeline } from './deck-timeline.js';
import { netlistCorner } from './netlist-corner.js';
import { spiceNumber as n } from './spice-number.js';
import {
  SWITCHED_NETLIST_DEFAULTS,
  type SwitchedNetlistOptions,
} from './switched-netlist-options.js';
import {
  KNEE_SATURATION_CURRENT_A,
  THERMAL_VOLTAGE_27C_V,
  SWITCH_OFF_RESISTANCE_OHM,
  DRAIN_CAPACITANCE_MIN_F,
} from './spice-device-constants.js';
import { LEAKAGE_DAMPING_RATIO } from '../topologies/double-ended/leakage-damping.js';

/** Options of the deck: those every buck-derived deck takes. */
export type DoubleEndedNetlistOptions = SwitchedNetlistOptions;

const DEFAULTS = SWITCHED_NETLIST_DEFAULTS;
/**
 * The push-pull deck's defaults: its leakage's ring resolved, 32 steps a ring (within about
 * 0.2 % of finer steps on the switch peaks; DEVELOPERS.md, "The double-ended decks' step against
 * the leakage's ring"), since the engine takes that ring with the stated damping
 * (`LEAKAGE_DAMPING_RATIO`) that the deck puts across each leakage, where the default step's own
 * damping (Gear) would read its peaks low. The bridges keep 0 in continuous conduction (their
 * rings are lumped in the engine there, and the full bridge with 2 µH in
 * `double-ended-netlist.test.ts` took 141 s against 13 s with them resolved, for the same
 * readings within 0.01 %); at light load see BRIDGE_SHARED_FALL_DEFAULTS.
 */
const PUSH_PULL_DEFAULTS = {
  ...SWITCHED_NETLIST_DEFAULTS,
  leakageRingStepsMin: 32,
} satisfies Required<DoubleEndedNetlistOptions>;
/**
 * A bridge's defaults where its light-load ring runs (a shared fall): the leakage's ring resolved
 * as on the push-pull, 32 steps a ring. There the engine's event model carries that ring undamped
 * and the deck puts only 30·Z across the leakage (LIGHT_LOAD_LEAKAGE_DAMPING_RATIO), so the
 * default step's own damping (Gear) took the ring's energy instead: the scan's 36–72 V full bridge
 * with 1 µH and 100 pF (a ring of 63 ns against a step of 26 ns; `ngspice-scan.ts --seed 47
 * --input telecom`, spec 5) settled 4.1 % below the engine at 72 V and 7.4 % load and 2.1 %
 * above at 36 V; at 8, 16, 32 and 64 steps a ring −0.45, +0.03, −0.11 and −0.15 % (DEVELOPERS.md,
 * "The ngspice check", audit of 2026-12-05, audit5). Corners in continuous conduction keep 0.
 */
const BRIDGE_SHARED_FALL_DEFAULTS = {
  ...SWITCHED_NETLIST_DEFAULTS,
  leakageRingStepsMin: 32,
} satisfies Required<DoubleEndedNetlistOptions>;

const PERIODS_TO_SIMULATE_MIN = 300;
/** The push-pull clamp's resistor where the clamp takes no power, Ω (the flyback deck's). */
const CLAMP_RESISTANCE_MAX_OHM = 1e7;
const BODY_DIODE_RESISTANCE_OHM = 0.05;
/**
 * A junction capacitance on the body diodes at light-load corners (a shared fall: the magnetizing
 * current does not start at its negative peak): without it a full bridge at 10 % load with 100 pF
 * switches stalled ngspice ("timestep too small" at a leg's node) as the winding's ring reached
 * the rail; 1 pF beside the switches' own capacitance lets it run. At full load the same 1 pF
 * stalled the full bridge (at a low-side node), so continuous-conduction corners go without.
 */
const BODY_DIODE_CAPACITANCE_F = 1e-12;
/** Half-bridge divider ripple over half the input, when its capacitors are sized. */
const DIVIDER_RIPPLE_RATIO = 0.002;
/** The leakage's resistor over √(Llk/Coss) on a bridge where the light-load ring runs. */
const LIGHT_LOAD_LEAKAGE_DAMPING_RATIO = 30;

/**
 * With `leakageRingStepsMin` set, the leakage ring's step is never below the default step over
 * this, to bound the run time. 32 gives 2 µH with 100 pF (a ring of 89 ns) its 32 steps down to
 * 100 kHz; 4, as it was, held such a ring to 7–14 steps at 100–200 kHz, where ngspice's gear
 * integration lengthened it by some 9 % and moved the turn-on's phase (the scan's seed 2, spec 15:
 * switch current +5.35 % at 14 steps a ring, +1.7 % at 64 and +1.5 % at 128).
 */
const LEAKAGE_RING_STEP_DIVISOR_MAX = 32;

/**
 * Whether the engine's corner has a shared fall (light load): its magnetizing current starts off
 * its negative peak (at the valley over n).
 */
function hasSharedFallAt(corner: DoubleEndedDesign['corners'][number]): boolean {
  const magnetizingStartA =
    corner.waveforms.magnetizingCurrentA.values[0] ?? -corner.magnetizingCurrentPeakA;
  return (
    Math.abs(magnetizingStartA + corner.magnetizingCurrentPeakA) >
    1e-9 * corner.magnetizingCurrentPeakA
  );
}

/**
 * Returns an ngspice netlist (text) of a push-pull or bridge `design` at one corner, open loop at
 * the engine's duty cycle (each gate on for D·T, the second half-period's gate delayed by T/2).
 * Measures: output_K_voltage_v (and _previous_v, _earlier_v windows), switch_current_peak_a
 * (the first switch, over its last on-time), switch_voltage_peak_v (the larger over the first
 * leg, or both push-pull switches), magnetizing_current_peak_a and _average_a (over the last
 * period: the average is the slow offset a start state slightly off the steady state leaves, a
 * half bridge's divider capacitors ringing with Lm at 1/(2π·√(Lm·2·Cdiv))).
 * @throws RangeError for an unknown corner label.
 */
export function doubleEndedNetlist(
  spec: Spec,
  design: DoubleEndedDesign,
  options: DoubleEndedNetlistOptions = {},
): string {
  const corner = netlistCorner(design, options.cornerLabel ?? DEFAULTS.cornerLabel);
  const defaults =
    design.topology === 'push-pull'
      ? PUSH_PULL_DEFAULTS
      : hasSharedFallAt(corner)
        ? BRIDGE_SHARED_FALL_DEFAULTS
        : DEFAULTS;
  const o = { ...defaults, ...options };
  const { choices } = design;
  const periodS = 1 / spec.switchingFrequencyHz;
  const onTimeS = corner.dutyCycle * periodS;
  const edgeS = Math.min(1e-3 * periodS, 0.02 * onTimeS);
  const timeline = deckTimeline(
    spec,
    choices.outputInductancesH,
    periodS,
    o.periodsToSimulate,
    PERIODS_TO_SIMULATE_MIN,
  );
  const { totalPeriods, window } = timeline;
  const switchPeakA = corner.switches[0]?.currentPeakA ?? 0;
  // The push-pull's RCD clamp as the engine designs it: R = Vc²/P into the rail from the
  // corner's clamp loss (so the capacitor settles at Vc only where the engine's P is the
  // circuit's); its RC spans at least 20 periods, as the flyback deck's. Where the engine finds
  // the spike below the clamp (P = 0) the resistor returns to a source Vc above the rail, so the
  // capacitor keeps Vc (a start-up spike above it drains away over those periods) and the
  // spike's own peak is what ngspice measures.
  const clampV = design.topology === 'push-pull' ? choices.clampVoltageV : undefined;
  const clampW = corner.losses.find((l) => l.component === 'leakage-clamp')?.powerW ?? 0;
  const drainF = Math.max(spec.primarySwitch.outputCapacitanceF, DRAIN_CAPACITANCE_MIN_F);
  const isClampHeld = !(clampW > 0);
  const leakageRingS = 2 * Math.PI * Math.sqrt(choices.leakageInductanceH * drainF);
  const clampOhm =
    clampV !== undefined && !isClampHeld
      ? Math.min(CLAMP_RESISTANCE_MAX_OHM, clampV ** 2 / clampW)
      : (20 * periodS) / (100 * drainF);
  const primary = doubleEndedPrimaryLines({
    kind: design.topology,
    inputVoltageV: corner.inputVoltageV,
    magnetizingInductanceH: choices.magnetizingInductanceH,
    // The engine's magnetizing current as the first half starts: its negative peak, or at light
    // load (shared fall) the valley over n.
    magnetizingStartA:
      corner.waveforms.magnetizingCurrentA.values[0] ?? -corner.magnetizingCurrentPeakA,
    leakageInductanceH: choices.leakageInductanceH,
    primaryOhm: choices.primaryResistanceOhm,
    drainCapacitanceF: drainF,
    dividerCapacitanceF:
      (switchPeakA * onTimeS) / (DIVIDER_RIPPLE_RATIO * Math.max(corner.inputVoltageV / 2, 1e-9)),
    // Where the light-load ring runs on a bridge (a shared fall: the event model, whose ring
    // carries the leakage undamped), the leakage's resistor is ten times lighter: the usual 3·Z
    // (Q about 3 with the node capacitance) damped the leakage's ring with the node within a
    // turn and moved the light-load steady state itself (the test helpers' full bridge at 360 V,
    // 10 % load, 32 µH, the output held at 48 V and D = 0.259: 1.22 A delivered at 3·Z, 1.36 A
    // at 300·Z, for a 1 A load; DEVELOPERS.md, "Known gaps at light load", item (6)).
    ...(hasSharedFallAt(corner) && design.topology !== 'push-pull'
      ? { leakageDampingRatio: LIGHT_LOAD_LEAKAGE_DAMPING_RATIO }
      : {}),
    // The push-pull with its clamp: the engine's own damping of the leakage's rings, one constant
    // for both (`LEAKAGE_DAMPING_RATIO`, leakage-damping.ts). The usual 3·Z (Q some 4 for the
    // ring of both halves' leakage with the off drain) took a tenth of the off drain's overshoot
    // as the other switch turns on and a fifth of the ring's current (the scan's 200–400 V
    // push-pull with 10 µH, seed 23, spec 0, at 200 V and full load: 540.6 V, where the circuit
    // without such a resistor rings to about 3·Vin; 10·Z 583.0 V, 30·Z 603.3 V, but at 30·Z the
    // ring outlasts the on-time and moved that design's output at 400 V and full load, +2.3 %
    // against +1.6 % at 10·Z).
    ...(clampV !== undefined ? { leakageDampingRatio: LEAKAGE_DAMPING_RATIO } : {}),
    ...(clampV === undefined || !(choices.leakageInductanceH > 0)
      ? {}
      : {
          clamp: {
            voltageV: clampV,
            resistanceOhm: clampOhm,
            capacitanceF: Math.max((20 * periodS) / clampOhm, 100 * drainF, 1e-9),
            isHeld: isClampHeld,
          },
        }),
  });
  const hasSharedFall = hasSharedFallAt(corner);
  const bodyJunction = hasSharedFall ? ` CJO=${n(BODY_DIODE_CAPACITANCE_F)}` : '';
  const gate = (delayS: number) =>
    `PULSE(0 1 ${n(delayS)} ${n(edgeS)} ${n(edgeS)} ${n(onTimeS - edgeS)} ${n(periodS)})`;
  const lines = [
    `${design.topology} at corner ${corner.label}, open loop: an independent check of the design`,
    '* CAUTION: results are engineering estimates that a qualified person must verify. Offline',
    '* converters carry lethal voltages and stored energy; safety spacing and insulation follow',
    '* the applicable standards, local codes and licensed practice.',
    `* Input ${n(corner.inputVoltageV)} V, load ${n(corner.loadFraction)} of full, duty cycle ` +
      `${n(corner.dutyCycle)} per switch, ${n(spec.switchingFrequencyHz)} Hz, Lm ${n(choices.magnetizingInductanceH)} H`,
    '* Start: magnetizing current where the engine starts the first half (its negative peak, or',
    '* the valley over n at light load: no flux offset), output capacitors at the design',
    '* voltages, inductors at their valley currents.',
    '* Ideal transformer: E/F sources across the magnetizing inductance; rectifier drops are a',
    '* knee diode (N=1) plus a DC source for the rest of the forward drop. rshunt puts 1 GΩ',
    '* from every node to ground: with several ideally coupled secondaries the push-pull deck',
    '* otherwise stops at its first dead time ("timestep too small"); it draws under 1 µA.',
    '.options method=gear temp=27 tnom=27 rshunt=1e9',
    ...primary.lines,
    `Vga ga 0 ${gate(0)}`,
    `Vgb gb 0 ${gate(periodS / 2)}`,
    `.model primary_switch SW(VT=0.5 VH=0 RON=${n(spec.primarySwitch.onResistanceOhm)} ROFF=${n(SWITCH_OFF_RESISTANCE_OHM)})`,
    ...spec.outputs.flatMap((output, k) =>
      doubleEndedOutputLines(k + 1, {
        turnsRatio: choices.outputTurnsRatios[k] ?? 1,
        arrangement: choices.secondaryArrangements[k] ?? 'center-tapped',
        windingOhm: choices.outputWindingResistancesOhm[k] ?? 0,
        inductanceH: choices.outputInductancesH[k] ?? 0,
        inductorOhm: choices.outputInductorResistancesOhm[k] ?? 0,
        output,
        voltageV: corner.outputs[k]?.voltageV ?? output.voltageV,
        loadA: corner.outputs[k]?.currentA ?? output.currentA,
        startA: corner.waveforms.outputInductorCurrentsA[k]?.values[0] ?? 0,
        // 1 pF snubbers also where the light-load ring runs (a shared fall: the event model,
        // one output or several), not only in DCM: the engine holds no rectifier capacitance
        // (DEVELOPERS.md, "Light load: the event model" and "Light load with several outputs:
        // the event model").
        isContinuous: corner.outputInductorModes[k] !== 'dcm' && !hasSharedFall,
        hasClampedLeakage: clampV !== undefined && choices.leakageInductanceH > 0,
        reference: primary.reference,
        knee: {
          saturationCurrentA: KNEE_SATURATION_CURRENT_A,
          slopeVoltageV: THERMAL_VOLTAGE_27C_V,
        },
      }),
    ),
    `.model knee D(IS=${n(KNEE_SATURATION_CURRENT_A)} N=1)`,
    // A body diode without series resistance stalled ngspice ("timestep too small") when the
    // opposite switch of its leg turned on while it conducted; 50 mΩ lets every case run. The
    // 1 pF junction capacitance lets the light-load full bridge's ring clamp run.
    `.model body D(IS=${n(KNEE_SATURATION_CURRENT_A)} N=1 RS=${n(BODY_DIODE_RESISTANCE_OHM)}${bodyJunction})`,
  ];
  for (let k = 1; k <= spec.outputs.length; k++) lines.push(...timeline.outputVoltageMeasures(k));
  const lastOnS = (totalPeriods - 1) * periodS + edgeS / 2;
  // The push-pull with its clamp: the off drain's ring as this switch turns on is switch current
  // (its first peak a quarter of the leakages' ring with the drain capacitance after the
  // commutation, some 70 ns at 10 µH and 100 pF, 10 ns at 0.2 µH), so the window skips only the
  // edge and the drain capacitance's discharge through its 1 Ω (under a nanosecond): from the
  // switch's turn-on (mid-edge) one edge on. Three edges until 2026-12-05 hid that crest with
  // 0.2 µH at 243 kHz (12.4 ns; ngspice's crest at 11.4 ns, DEVELOPERS.md, "The push-pull's
  // short dead time").
  const currentSkipS =
    clampV !== undefined && choices.leakageInductanceH > 0
      ? Math.min(o.onTimeSkipFraction * onTimeS, edgeS)
      : o.onTimeSkipFraction * onTimeS;
  const voltageNames = primary.switchVoltages.map((_, i) => `switch_${i + 1}_voltage_peak_v`);
  lines.push(
    `.meas tran switch_current_peak_a MAX i(${primary.firstSwitchSense}) from=${n(lastOnS + currentSkipS)} to=${n(lastOnS + onTimeS)}`,
    ...primary.switchVoltages.map(
      (expression, i) => `.meas tran ${voltageNames[i]} MAX ${expression} ${window(0)}`,
    ),
    `.meas tran switch_voltage_peak_v param='max(${voltageNames.join(',')})'`,
    `.meas tran magnetizing_current_peak_a MAX i(vmag) ${timeline.lastPeriod}`,
    `.meas tran magnetizing_current_average_a AVG i(vmag) ${timeline.lastPeriod}`,
    timeline.tranLine(
      onTimeS,
      stepsPerPeriodWithRing(o.stepsPerPeriod, o.leakageRingStepsMin, periodS, leakageRingS),
    ),
    '.end',
  );
  return `${lines.join('\n')}\n`;
}

/**
 * Steps per switching period: `stepsPerPeriod`, or more where the leakage rings (`ringS` > 0) so
 * that its ring gets `ringStepsMin` steps, up to LEAKAGE_RING_STEP_DIVISOR_MAX times more.
 */
function stepsPerPeriodWithRing(
  stepsPerPeriod: number,
  ringStepsMin: number,
  periodS: number,
  ringS: number,
): number {
  if (!(ringS > 0 && ringStepsMin > 0)) return stepsPerPeriod;
  const forRing = (ringStepsMin * periodS) / ringS;
  return Math.min(
    LEAKAGE_RING_STEP_DIVISOR_MAX * stepsPerPeriod,
    Math.max(stepsPerPeriod, forRing),
  );
}
