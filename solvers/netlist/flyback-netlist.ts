import type { Corner, FlybackDesign } from '../design/design-schema.js';
import type { Spec } from '../spec/spec-schema.js';
import { flybackMeasurementLines } from './flyback-measurement-lines.js';
import { flybackSecondaryLines } from './flyback-secondary-lines.js';
import { netlistCorner } from './netlist-corner.js';
import { spiceNumber as n } from './spice-number.js';

/** Options of {@link flybackNetlist}; every field optional. */
export interface FlybackNetlistOptions {
  /** Label of the corner to simulate; '' picks the lowest input at the largest load. @defaultValue '' */
  cornerLabel?: string;
  /**
   * Switching periods simulated from the start-up state; 0 picks max(400, 4 averaging windows).
   * @defaultValue 0
   */
  periodsToSimulate?: number;
  /**
   * Periods each of the three closing averaging windows spans; 0 picks a quarter of the run,
   * rounded to whole ring periods of the output filter in continuous conduction. @defaultValue 0
   */
  periodsToAverage?: number;
  /** Last periods whose switch current peaks are read. @defaultValue 3 */
  periodsForPeaks?: number;
  /**
   * Largest time step is periodS / stepsPerPeriod, or less: the idle ring of Lm with the switch
   * capacitance gets at least RING_STEPS_MIN steps a ring period, and the leakage's ring with it
   * LEAKAGE_RING_STEPS_MIN (down to a quarter of this step). @defaultValue 100
   */
  stepsPerPeriod?: number;
  /** Fraction of each on-time skipped at its start for the switch current peak. @defaultValue 0.05 */
  onTimeSkipFraction?: number;
}

const DEFAULTS = {
  cornerLabel: '',
  periodsToSimulate: 0,
  periodsToAverage: 0,
  periodsForPeaks: 3,
  stepsPerPeriod: 100,
  onTimeSkipFraction: 0.05,
} satisfies Required<FlybackNetlistOptions>;

/** Runs are at least this long, in periods: start-up residue then decays through three windows. */
const PERIODS_TO_SIMULATE_MIN = 400;

/**
 * The rectifier and clamp diode: N = 1 and IS = 1 µA, so its drop moves by kT/q·ln(i/i_mean)
 * around the mean conduction current the series DC source is corrected for (60 mV per decade).
 * Sharper knees (N = 0.01) cost 5-25 times the Newton iterations and moved results by < 0.03 %.
 */
const KNEE_SATURATION_CURRENT_A = 1e-6;
const KNEE_EMISSION_COEFFICIENT = 1;
/** kT/q at the simulator's 27 °C, V. ref: CODATA 2018 exact values of k and e */
const THERMAL_VOLTAGE_27C_V = (1.380649e-23 * 300.15) / 1.602176634e-19;
const SWITCH_OFF_RESISTANCE_OHM = 1e7;
/** In series with the switch capacitance: its discharge stays finite, far faster than an edge. */
const COSS_SERIES_RESISTANCE_OHM = 1;
const CLAMP_RESISTANCE_MAX_OHM = 1e7;
/**
 * Fewest time steps per period of the idle ring (Lm + leakage with the switch capacitance).
 * Gear integration damps a ring it samples coarsely: with 6 steps a period the ring of a
 * 26 µH, 100 pF case had nearly died by turn-on and the 10 %-load output came out 3 % high;
 * at 32 steps a period the ring lasts and the output settles within 0.4 % of the engine (64: 0.01 %).
 */
const RING_STEPS_MIN = 32;
/**
 * Largest share of the idle ring's amplitude Gear integration may take over one switching period
 * in discontinuous conduction. Gear's second order multiplies an undamped ring by 1 − θ⁴/4 a step
 * of θ = 2π/S radians (its amplification factor for z' = iωz, to leading order; 3.39e-4 a step at
 * S = 32 solved exactly), so about (2π)⁴/(4·S³) = 390/S³ a ring period. At 32 steps the ring of
 * an 11 µH, 100 pF flyback at 6.6 % load (ngspice-scan seed 41, spec 11, 72 V; 18 ring periods a
 * switching period) lost some 12 % by turn-on and the output read −2.6 % against the engine; at
 * 64 and 128 steps −1.0 % and −0.6 % (ngspice 2026-12-05; DEVELOPERS, "The ngspice check").
 */
const IDLE_RING_DECAY_MAX = 0.005;
/**
 * The idle ring's steps are at most this many a ring period, to bound the run time (4 times the
 * old 32): at 128 Gear takes some 0.2 % of the ring a ring period, 1 % over 50 of them.
 */
const IDLE_RING_STEPS_MAX = 4 * RING_STEPS_MIN;
/**
 * The resistor across the leakage over √(Llk/C) of its ring with the drain capacitance: the
 * ring's quality factor Q. The ring lifts the drain within a quarter of its period, over which
 * a parallel resistor of Q·Z takes about π/(2Q) of its energy (common practice, parallel RLC).
 * At 3 the 1 nF case's switch peak came out 3.3 % under the engine's lossless ring (at fine
 * steps), at 10 1.6 %, at 100 0.6 %; a larger Q leaves the ring ringing through the off-time.
 */
const LEAKAGE_DAMPING_RATIO = 10;
/**
 * Fewest time steps per period of the leakage's ring with the drain capacitance, which sets the
 * switch voltage peak: at 2.6 steps a period Gear integration took 4 % off the 1 nF case's peak.
 * The step it asks for is never below a quarter of the default step, to bound the run time.
 */
const LEAKAGE_RING_STEPS_MIN = 16;
/** Drain capacitance assumed for the leakage damping when the spec gives the switch none, F. */
const DRAIN_CAPACITANCE_MIN_F = 10e-12;

/**
 * Returns an ngspice netlist (text) of the flyback `design` at one corner, open loop at the
 * engine's duty cycle. Its `.meas` results are named in {@link flybackMeasurementLines}.
 * @throws RangeError for an unknown corner label or windows that do not fit the run.
 */
export function flybackNetlist(
  spec: Spec,
  design: FlybackDesign,
  options: FlybackNetlistOptions = {},
): string {
  const o = { ...DEFAULTS, ...options };
  const corner = netlistCorner(design, o.cornerLabel);
  const { choices } = design;
  const periodS = 1 / spec.switchingFrequencyHz;
  const onTimeS = corner.dutyCycle * periodS;
  const edgeS = Math.min(1e-3 * periodS, 0.02 * onTimeS);
  const { totalPeriods, averagedPeriods } = runLength(spec, design, corner, o);
  if (!(o.periodsForPeaks >= 1 && o.stepsPerPeriod >= 1 && o.onTimeSkipFraction < 1)) {
    throw new RangeError('flybackNetlist: periodsForPeaks and stepsPerPeriod must be >= 1');
  }
  const cossF = spec.primarySwitch.outputCapacitanceF;
  const leakageH = choices.leakageInductanceH;
  const ringPeriodS = 2 * Math.PI * Math.sqrt((choices.magnetizingInductanceH + leakageH) * cossF);
  const leakageRingPeriodS =
    2 * Math.PI * Math.sqrt(leakageH * Math.max(cossF, DRAIN_CAPACITANCE_MIN_F));
  const stepMaxS = Math.min(
    periodS / o.stepsPerPeriod,
    cossF > 0
      ? ringPeriodS / idleRingSteps(corner.conductionMode, periodS / ringPeriodS)
      : Infinity,
    leakageH > 0
      ? Math.max(leakageRingPeriodS / LEAKAGE_RING_STEPS_MIN, periodS / (4 * o.stepsPerPeriod))
      : Infinity,
  );
  const valleyA = Math.max(0, corner.magnetizingCurrentPeakA - corner.magnetizingCurrentRippleA);
  const clampOhm =
    corner.clamp.powerW > 0
      ? Math.min(CLAMP_RESISTANCE_MAX_OHM, corner.clamp.voltageV ** 2 / corner.clamp.powerW)
      : CLAMP_RESISTANCE_MAX_OHM;
  const lines = [
    `Flyback converter at corner ${corner.label}, open loop: an independent check of the design`,
    '* CAUTION: results are engineering estimates that a qualified person must verify. Offline',
    '* converters carry lethal voltages and stored energy; safety spacing and insulation follow',
    '* the applicable standards, local codes and licensed practice.',
    `* Input ${n(corner.inputVoltageV)} V, load ${n(corner.loadFraction)} of full, duty cycle ` +
      `${n(corner.dutyCycle)} (${corner.conductionMode}), ${n(spec.switchingFrequencyHz)} Hz`,
    `* Lm ${n(choices.magnetizingInductanceH)} H, leakage ${n(leakageH)} H, clamp ` +
      `${n(corner.clamp.voltageV)} V dissipating ${n(corner.clamp.powerW)} W`,
    '* Start: capacitors at the design voltages, magnetizing current at its valley, so the run',
    '* begins near the periodic steady state (no half first pulse: a flyback carries DC flux).',
    '* Rectifier Vf + R*i: a diode (N=1) + DC source (Vf less the diode drop at the mean',
    '* conduction current) + R; the drop follows kT/q*ln(i/mean) around it, which averages to',
    '* within 0.31*kT/q (8 mV) over a conduction interval. A synchronous rectifier is its Rds',
    '* behind that diode (off at zero current); its dead-time body-diode conduction is left out.',
    '* Ideal transformer: E/F sources; each secondary return is tied to ground (no current flows).',
    '.options method=gear temp=27 tnom=27',
    `Vin in 0 DC ${n(corner.inputVoltageV)}`,
    ...primaryWinding(
      choices.primaryResistanceOhm,
      leakageH,
      Math.max(cossF, DRAIN_CAPACITANCE_MIN_F),
    ),
    `Lm mag drain ${n(choices.magnetizingInductanceH)} IC=${n(valleyA)}`,
    '* Primary switch; the current sense holds the switch capacitance, so its discharge is unseen.',
    'Sprimary drain src gate 0 primary_switch',
    `.model primary_switch SW(VT=0.5 VH=0 RON=${n(spec.primarySwitch.onResistanceOhm)} ROFF=${n(SWITCH_OFF_RESISTANCE_OHM)})`,
    ...(cossF > 0
      ? [`Coss drain coss_r ${n(cossF)}`, `Rcoss coss_r src ${n(COSS_SERIES_RESISTANCE_OHM)}`]
      : []),
    'Vsense src 0 DC 0',
    `Vgate gate 0 PULSE(0 1 0 ${n(edgeS)} ${n(edgeS)} ${n(onTimeS - edgeS)} ${n(periodS)})`,
    '* RCD clamp: R = Vc^2 / Pclamp from the design; its RC spans at least 20 periods.',
    'Dclamp drain clamp knee',
    `Cclamp clamp in ${n(Math.max((20 * periodS) / clampOhm, 100 * cossF, 1e-9))} IC=${n(corner.clamp.voltageV)}`,
    `Rclamp clamp in ${n(clampOhm)}`,
    ...spec.outputs.flatMap((output, k) =>
      flybackSecondaryLines(k + 1, {
        turnsRatio: at(choices.outputTurnsRatios, k),
        windingOhm: at(choices.outputWindingResistancesOhm, k),
        output,
        cornerOutput: at(corner.outputs, k),
        conductionFraction: corner.demagnetizingDutyCycle,
        knee: {
          saturationCurrentA: KNEE_SATURATION_CURRENT_A,
          slopeVoltageV: KNEE_EMISSION_COEFFICIENT * THERMAL_VOLTAGE_27C_V,
        },
      }),
    ),
    `.model knee D(IS=${n(KNEE_SATURATION_CURRENT_A)} N=${n(KNEE_EMISSION_COEFFICIENT)})`,
    ...flybackMeasurementLines(spec.outputs.length, {
      periodS,
      onTimeS,
      edgeS,
      totalPeriods,
      averagedPeriods,
      peakPeriods: Math.min(o.periodsForPeaks, averagedPeriods),
      onTimeSkipFraction: o.onTimeSkipFraction,
    }),
    // End mid on-time, never on a gate edge; store only the three averaging windows.
    `.tran ${n(periodS / o.stepsPerPeriod)} ${n(totalPeriods * periodS + onTimeS / 2)} ` +
      `${n((totalPeriods - 3 * averagedPeriods) * periodS)} ${n(stepMaxS)} uic`,
    '.end',
  ];
  return `${lines.join('\n')}\n`;
}

/** Primary resistance and leakage from `in` to `mag`; a resistor damps the leakage ringing. */
function primaryWinding(resistanceOhm: number, leakageH: number, drainF: number): string[] {
  const lines: string[] = [];
  let node = 'in';
  if (resistanceOhm > 0) {
    lines.push(`Rpri in pri ${n(resistanceOhm)}`);
    node = 'pri';
  }
  if (leakageH > 0) {
    // Across the leakage, LEAKAGE_DAMPING_RATIO times the characteristic impedance of its ring
    // with the drain capacitance: the ring dies within a few cycles of the demagnetization.
    lines.push(
      `Llk ${node} mag ${n(leakageH)} IC=0`,
      `Rlk ${node} mag ${n(LEAKAGE_DAMPING_RATIO * Math.sqrt(leakageH / drainF))}`,
    );
  } else {
    lines.push(`Vlk ${node} mag DC 0`);
  }
  return lines;
}

/**
 * The run length and the averaging window, in whole periods. In continuous conduction a window
 * spans whole rings of the output filter with the magnetizing inductance, reflected to the first
 * output as Lm / (n·(1 − D))², so that the ring averages out.
 * @throws RangeError when three windows do not fit into the run.
 */
function runLength(
  spec: Spec,
  design: FlybackDesign,
  corner: Corner,
  o: Required<FlybackNetlistOptions>,
): { totalPeriods: number; averagedPeriods: number } {
  let ringPeriods = 1;
  if (corner.conductionMode === 'ccm') {
    const ratios = design.choices.outputTurnsRatios;
    const first = at(ratios, 0);
    const inductanceH =
      design.choices.magnetizingInductanceH / (first * (1 - corner.dutyCycle)) ** 2;
    // Each output's capacitance referred to the first output by its squared voltage ratio.
    const capacitanceF = spec.outputs.reduce(
      (sum, output, k) => sum + output.capacitanceF * (first / at(ratios, k)) ** 2,
      0,
    );
    const ringS = 2 * Math.PI * Math.sqrt(inductanceH * capacitanceF);
    ringPeriods = Math.max(1, Math.round(ringS * spec.switchingFrequencyHz));
  }
  const requested = Math.round(o.periodsToSimulate);
  const totalPeriods =
    requested > 0 ? requested : Math.max(PERIODS_TO_SIMULATE_MIN, 4 * ringPeriods);
  const averagedPeriods =
    o.periodsToAverage > 0
      ? Math.round(o.periodsToAverage)
      : ringPeriods * Math.max(1, Math.floor(totalPeriods / 4 / ringPeriods));
  if (!(averagedPeriods >= 1 && totalPeriods >= 3 * averagedPeriods)) {
    throw new RangeError(
      `flybackNetlist: periodsToSimulate ${totalPeriods} must hold three averaging windows of ` +
        `${averagedPeriods} periods`,
    );
  }
  return { totalPeriods, averagedPeriods };
}

function at<T>(items: readonly T[], index: number): T {
  const item = items[index];
  if (item === undefined) throw new RangeError(`flybackNetlist: design has no entry ${index}`);
  return item;
}

/**
 * Time steps per period of the idle ring (Lm with the switch capacitance): RING_STEPS_MIN, or in
 * discontinuous conduction enough that Gear integration takes at most IDLE_RING_DECAY_MAX of the
 * ring over `ringPeriods` (the switching period's ring periods, more than the idle interval holds),
 * up to IDLE_RING_STEPS_MAX.
 */
function idleRingSteps(mode: Corner['conductionMode'], ringPeriods: number): number {
  if (mode !== 'dcm') return RING_STEPS_MIN;
  const perRingPeriod = IDLE_RING_DECAY_MAX / ringPeriods;
  const steps = Math.cbrt((2 * Math.PI) ** 4 / (4 * perRingPeriod));
  return Math.min(IDLE_RING_STEPS_MAX, Math.max(RING_STEPS_MIN, steps));
}
