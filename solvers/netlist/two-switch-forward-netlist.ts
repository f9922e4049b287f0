import type { ForwardDesign, ResetWindingForwardDesign } from '../design/design-schema.js';
import type { Spec } from '../spec/spec-schema.js';
import { CLAMP_DIODE_DEFAULT_V } from '../topologies/two-switch-forward/two-switch-forward-state.js';
import { FORWARD_LEAKAGE_DAMPING_RATIO } from '../topologies/two-switch-forward/leakage-spike.js';
import { forwardOutputLines } from './forward-output-lines.js';
import { deckTimeline } from './deck-timeline.js';
import { netlistCorner } from './netlist-corner.js';
import { spiceNumber as n } from './spice-number.js';
import { valueAt } from '../waveform/value-at.js';
import {
  SWITCHED_NETLIST_DEFAULTS,
  type SwitchedNetlistOptions,
} from './switched-netlist-options.js';
import {
  KNEE_SATURATION_CURRENT_A,
  THERMAL_VOLTAGE_27C_V,
  SWITCH_OFF_RESISTANCE_OHM,
  COSS_SERIES_RESISTANCE_OHM,
  DRAIN_CAPACITANCE_MIN_F,
  RESET_PATH_RESISTANCE_OHM,
} from './spice-device-constants.js';

/** Options of the deck: those every buck-derived deck takes. */
export type TwoSwitchForwardNetlistOptions = SwitchedNetlistOptions;

const DEFAULTS = SWITCHED_NETLIST_DEFAULTS;

const PERIODS_TO_SIMULATE_MIN = 400;

/**
 * Returns an ngspice netlist (text) of a forward `design` at one corner, open loop at the
 * engine's duty cycle: two switches and two clamp diodes, or (reset-winding forward) one switch
 * and a reset winding with its diode, made of controlled sources like the secondaries. Measures: output_K_voltage_v (and _previous_v, _earlier_v windows),
 * switch_current_peak_a, switch_voltage_peak_v (the larger of the two switches),
 * magnetizing_current_peak_a, magnetizing_current_end_a (just before the next turn-on).
 * @throws RangeError for an unknown corner label.
 */
export function twoSwitchForwardNetlist(
  spec: Spec,
  design: ForwardDesign | ResetWindingForwardDesign,
  options: TwoSwitchForwardNetlistOptions = {},
): string {
  const o = { ...DEFAULTS, ...options };
  const corner = netlistCorner(design, o.cornerLabel);
  const { choices } = design;
  const periodS = 1 / spec.switchingFrequencyHz;
  const onTimeS = corner.dutyCycle * periodS;
  const edgeS = Math.min(1e-3 * periodS, 0.02 * onTimeS);
  const cossF = spec.primarySwitch.outputCapacitanceF;
  const clampV = spec.primaryClampDiode?.forwardVoltageV ?? CLAMP_DIODE_DEFAULT_V;
  const slopeV = THERMAL_VOLTAGE_27C_V;
  const magnetizingStartA = valueAt(corner.waveforms.magnetizingCurrentA, 0);
  const clampKneeV =
    slopeV * Math.log1p(corner.magnetizingCurrentPeakA / 2 / KNEE_SATURATION_CURRENT_A);
  const timeline = deckTimeline(
    spec,
    choices.outputInductancesH,
    periodS,
    o.periodsToSimulate,
    PERIODS_TO_SIMULATE_MIN,
  );
  const { totalPeriods, window } = timeline;
  const leakageH = choices.leakageInductanceH;
  const drainF = Math.max(cossF, DRAIN_CAPACITANCE_MIN_F);
  const resetRatio = 'resetTurnsRatio' in choices ? choices.resetTurnsRatio : undefined;
  const primaryLines =
    resetRatio === undefined
      ? [
          'Vsense in d1 DC 0',
          'Shigh d1 a gate 0 primary_switch',
          `Chigh d1 ch ${n(drainF)}`,
          `Rchigh ch a ${n(COSS_SERIES_RESISTANCE_OHM)}`,
          '* Clamp diodes: 0 -> a and b -> in return the magnetizing current to the input.',
          'Dclamp1 0 k1 knee',
          `Vclamp1 k1 a DC ${n(clampV - clampKneeV)}`,
          'Dclamp2 b k2 knee',
          `Vclamp2 k2 in DC ${n(clampV - clampKneeV)}`,
        ]
      : [
          'Vtop in a DC 0',
          `* Reset winding Nr/Np ${n(resetRatio)}: its diode returns the magnetizing current to the input.`,
          '* Ideally coupled to the primary, as the engine takes it (wound directly under it): across the',
          '* primary on the input side of the leakage, so the leakage current at turn-off returns',
          '* through the reset diode too, as the engine takes it.',
          `Ereset rs 0 b pri ${n(resetRatio)}`,
          `Freset b pri Vrsense ${n(resetRatio)}`,
          'Vrsense rs rsr DC 0',
          `Rreset rsr rs2 ${n(RESET_PATH_RESISTANCE_OHM)}`,
          'Dreset rs2 kr knee',
          `Vreset kr in DC ${n(clampV - slopeV * Math.log1p(corner.magnetizingCurrentPeakA / resetRatio / 2 / KNEE_SATURATION_CURRENT_A))}`,
        ];
  const lines = [
    `${resetRatio === undefined ? 'Two-switch forward' : 'Forward with a reset winding'} at corner ${corner.label}, open loop: an independent check of the design`,
    '* CAUTION: results are engineering estimates that a qualified person must verify. Offline',
    '* converters carry lethal voltages and stored energy; safety spacing and insulation follow',
    '* the applicable standards, local codes and licensed practice.',
    `* Input ${n(corner.inputVoltageV)} V, load ${n(corner.loadFraction)} of full, duty cycle ` +
      `${n(corner.dutyCycle)}, ${n(spec.switchingFrequencyHz)} Hz, Lm ${n(choices.magnetizingInductanceH)} H`,
    `* Start: magnetizing current at the engine's turn-on value ${n(magnetizingStartA)} A (the ring of`,
    '* Lm with the drain capacitance after the reset leaves it at or below zero; lossless, an',
    '* offset would persist), output capacitors at the design voltages, inductors at their valleys.',
    '* Ideal transformer: E/F sources across the magnetizing inductance; clamp and rectifier',
    '* drops are a knee diode (N=1) plus a DC source for the rest of the forward drop.',
    // abstol 1 nA (1 pA by default), as the active-clamp deck: with three outputs the reset
    // winding's deck stopped with "timestep too small" at the reset node (400 V, full load), and
    // every held three-output light-load deck tried did too; with it they run (DEVELOPERS.md).
    '.options method=gear temp=27 tnom=27 abstol=1e-9',
    `Vin in 0 DC ${n(corner.inputVoltageV)}`,
    ...primaryLines,
    'Slow b s2 gate 0 primary_switch',
    'Vlowsense s2 0 DC 0',
    `.model primary_switch SW(VT=0.5 VH=0 RON=${n(spec.primarySwitch.onResistanceOhm)} ROFF=${n(SWITCH_OFF_RESISTANCE_OHM)})`,
    `Clow b cl ${n(drainF)}`,
    `Rclow cl s2 ${n(COSS_SERIES_RESISTANCE_OHM)}`,
    `Vgate gate 0 PULSE(0 1 0 ${n(edgeS)} ${n(edgeS)} ${n(onTimeS - edgeS)} ${n(periodS)})`,
    ...(choices.primaryResistanceOhm > 0
      ? [`Rpri a pri ${n(choices.primaryResistanceOhm)}`]
      : ['Vpri a pri DC 0']),
    ...(leakageH > 0
      ? [
          `Llk pri p ${n(leakageH)} IC=0`,
          `Rlk pri p ${n(FORWARD_LEAKAGE_DAMPING_RATIO * Math.sqrt(leakageH / drainF))}`,
        ]
      : ['Vlk pri p DC 0']),
    'Vmag p pm DC 0',
    `Lm pm b ${n(choices.magnetizingInductanceH)} IC=${n(magnetizingStartA)}`,
    ...spec.outputs.flatMap((output, k) =>
      forwardOutputLines(k + 1, {
        turnsRatio: choices.outputTurnsRatios[k] ?? 1,
        windingOhm: choices.outputWindingResistancesOhm[k] ?? 0,
        inductanceH: choices.outputInductancesH[k] ?? 0,
        inductorOhm: choices.outputInductorResistancesOhm[k] ?? 0,
        output,
        voltageV: corner.outputs[k]?.voltageV ?? output.voltageV,
        loadA: corner.outputs[k]?.currentA ?? output.currentA,
        rippleA: corner.outputInductorCurrentRipplesA[k] ?? 0,
        isContinuous: corner.outputInductorModes[k] === 'ccm',
        knee: { saturationCurrentA: KNEE_SATURATION_CURRENT_A, slopeVoltageV: slopeV },
      }),
    ),
    `.model knee D(IS=${n(KNEE_SATURATION_CURRENT_A)} N=1)`,
  ];
  for (let k = 1; k <= spec.outputs.length; k++) lines.push(...timeline.outputVoltageMeasures(k));
  const lastOnS = (totalPeriods - 1) * periodS + edgeS / 2;
  lines.push(
    `.meas tran switch_current_peak_a MAX i(${resetRatio === undefined ? 'vsense' : 'vlowsense'}) from=${n(lastOnS + o.onTimeSkipFraction * onTimeS)} to=${n(lastOnS + onTimeS)}`,
    ...(resetRatio === undefined
      ? [
          `.meas tran high_switch_voltage_peak_v MAX par('v(d1)-v(a)') ${window(0)}`,
          `.meas tran low_switch_voltage_peak_v MAX v(b) ${window(0)}`,
          `.meas tran switch_voltage_peak_v param='max(high_switch_voltage_peak_v,low_switch_voltage_peak_v)'`,
        ]
      : [`.meas tran switch_voltage_peak_v MAX v(b) ${window(0)}`]),
    `.meas tran magnetizing_current_peak_a MAX i(vmag) ${timeline.lastPeriod}`,
    `.meas tran magnetizing_current_end_a FIND i(vmag) AT=${n((totalPeriods - 0.01) * periodS)}`,
    timeline.tranLine(onTimeS, o.stepsPerPeriod),
    '.end',
  );
  return `${lines.join('\n')}\n`;
}
