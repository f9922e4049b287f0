import type { ActiveClampForwardDesign } from '../design/design-schema.js';
import type { Spec } from '../spec/spec-schema.js';
import {
  auxiliarySwitchOf,
  CLAMP_DEAD_TIME_DEFAULT_S,
} from '../topologies/active-clamp-forward/active-clamp-forward-circuit.js';
import { forwardOutputLines } from './forward-output-lines.js';
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

/** Options of the deck: those every buck-derived deck takes. */
export type ActiveClampForwardNetlistOptions = SwitchedNetlistOptions;

const DEFAULTS = SWITCHED_NETLIST_DEFAULTS;

const PERIODS_TO_SIMULATE_MIN = 400;

/**
 * Returns an ngspice netlist (text) of an active-clamp forward `design` at one corner, open loop
 * at the engine's duty cycle: the main switch, and the auxiliary switch (gated complementarily
 * with the spec's dead time at both edges, with its body diode) in series with the clamp
 * capacitor and its ESR from the drain to the input rail (high-side clamp). Measures:
 * output_K_voltage_v (and _previous_v, _earlier_v windows), switch_current_peak_a,
 * switch_voltage_peak_v, clamp_voltage_average_v, magnetizing_current_valley_a.
 * @throws RangeError for an unknown corner label or a dead time that leaves the auxiliary no time.
 */
export function activeClampForwardNetlist(
  spec: Spec,
  design: ActiveClampForwardDesign,
  options: ActiveClampForwardNetlistOptions = {},
): string {
  const o = { ...DEFAULTS, ...options };
  const corner = netlistCorner(design, o.cornerLabel);
  const { choices } = design;
  const periodS = 1 / spec.switchingFrequencyHz;
  const onTimeS = corner.dutyCycle * periodS;
  const edgeS = Math.min(1e-3 * periodS, 0.02 * onTimeS);
  const deadS = spec.activeClamp?.deadTimeS ?? CLAMP_DEAD_TIME_DEFAULT_S;
  const auxOnS = periodS - onTimeS - 2 * deadS - edgeS;
  if (!(auxOnS > 0)) {
    throw new RangeError('activeClampForwardNetlist: the dead time leaves the auxiliary no time');
  }
  const main = spec.primarySwitch;
  const aux = auxiliarySwitchOf(spec);
  const timeline = deckTimeline(
    spec,
    choices.outputInductancesH,
    periodS,
    o.periodsToSimulate,
    PERIODS_TO_SIMULATE_MIN,
  );
  const { totalPeriods, window } = timeline;
  const leakageH = choices.leakageInductanceH;
  const mainF = Math.max(main.outputCapacitanceF, DRAIN_CAPACITANCE_MIN_F);
  const auxF = Math.max(aux.outputCapacitanceF, DRAIN_CAPACITANCE_MIN_F);
  // The clamp capacitor's voltage while the main switch conducts (its rest value).
  const restV = corner.waveforms.clampCapacitorVoltageV.values[0] ?? 0;
  const lines = [
    `Active-clamp forward at corner ${corner.label}, open loop: an independent check of the design`,
    '* CAUTION: results are engineering estimates that a qualified person must verify. Offline',
    '* converters carry lethal voltages and stored energy; safety spacing and insulation follow',
    '* the applicable standards, local codes and licensed practice.',
    `* Input ${n(corner.inputVoltageV)} V, load ${n(corner.loadFraction)} of full, duty cycle ` +
      `${n(corner.dutyCycle)}, ${n(spec.switchingFrequencyHz)} Hz, Lm ${n(choices.magnetizingInductanceH)} H, ` +
      `clamp ${n(choices.clampCapacitanceF)} F, dead time ${n(deadS)} s`,
    '* Start: magnetizing current at its engine value at turn-on, clamp capacitor at its rest voltage, output',
    '* capacitors at the design voltages, inductors at their valley currents.',
    // abstol 1 nA (1 pA by default) and chgtol 1e-15 C (1e-14): with the drain capacitances
    // straight across the switches alone, two light-load corners of a 200–400 V scan design
    // stalled; with both every one of 27 corners and 20 perturbed decks ran (DEVELOPERS.md).
    '.options method=gear temp=27 tnom=27 abstol=1e-9 chgtol=1e-15',
    `Vin in 0 DC ${n(corner.inputVoltageV)}`,
    'Vtop in a DC 0',
    ...(choices.primaryResistanceOhm > 0
      ? [`Rpri a pri ${n(choices.primaryResistanceOhm)}`]
      : ['Vpri a pri DC 0']),
    ...(leakageH > 0
      ? [`Llk pri p ${n(leakageH)} IC=0`, `Rlk pri p ${n(3 * Math.sqrt(leakageH / mainF))}`]
      : ['Vlk pri p DC 0']),
    'Vmag p pm DC 0',
    `Lm pm b ${n(choices.magnetizingInductanceH)} IC=${n(corner.waveforms.magnetizingCurrentA.values[0] ?? 0)}`,
    '* Main switch, drain b; its capacitance and body diode inside the current sense.',
    // The drain capacitances sit straight across their switches, with no series resistor: with
    // the 1 Ω the other decks use, ngspice stalled ("timestep too small ... node cm", the node
    // between them) at a switching edge on 6 of 27 corners, at the deck's own step; without it
    // and with the tolerances above every one ran, the outputs moved by at most 0.01 % and the
    // magnetizing valleys by at most 0.2 % (DEVELOPERS.md, "ngspice stalled on this deck").
    'Smain b s1 gate 0 main_switch',
    'Vsense s1 0 DC 0',
    `Cmain b s1 ${n(mainF)}`,
    'Dmain s1 b body',
    `.model main_switch SW(VT=0.5 VH=0 RON=${n(main.onResistanceOhm)} ROFF=${n(SWITCH_OFF_RESISTANCE_OHM)})`,
    `Vgate gate 0 PULSE(0 1 0 ${n(edgeS)} ${n(edgeS)} ${n(onTimeS - edgeS)} ${n(periodS)})`,
    '* High-side clamp: auxiliary switch from the drain to x, clamp capacitor from x to the input.',
    'Vauxsense b x1 DC 0',
    'Saux x1 x gateaux 0 aux_switch',
    `Caux x1 x ${n(auxF)}`,
    'Daux x1 x body',
    `.model aux_switch SW(VT=0.5 VH=0 RON=${n(aux.onResistanceOhm)} ROFF=${n(SWITCH_OFF_RESISTANCE_OHM)})`,
    `Vgateaux gateaux 0 PULSE(0 1 ${n(onTimeS + deadS)} ${n(edgeS)} ${n(edgeS)} ${n(auxOnS)} ${n(periodS)})`,
    ...(choices.clampCapacitorEsrOhm > 0
      ? [`Resr x xc ${n(choices.clampCapacitorEsrOhm)}`]
      : ['Vesr x xc DC 0']),
    `Cclamp xc in ${n(choices.clampCapacitanceF)} IC=${n(restV)}`,
    // A body diode of about 0.7 V at 1 A: n·Vt·ln(1 A/IS) with IS = 1e-12 A.
    '.model body D(IS=1e-12 N=1)',
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
        knee: {
          saturationCurrentA: KNEE_SATURATION_CURRENT_A,
          slopeVoltageV: THERMAL_VOLTAGE_27C_V,
        },
      }),
    ),
    `.model knee D(IS=${n(KNEE_SATURATION_CURRENT_A)} N=1)`,
  ];
  for (let k = 1; k <= spec.outputs.length; k++) lines.push(...timeline.outputVoltageMeasures(k));
  const lastOnS = (totalPeriods - 1) * periodS + edgeS / 2;
  lines.push(
    `.meas tran switch_current_peak_a MAX i(vsense) from=${n(lastOnS + o.onTimeSkipFraction * onTimeS)} to=${n(lastOnS + onTimeS)}`,
    `.meas tran switch_voltage_peak_v MAX v(b) ${window(0)}`,
    `.meas tran clamp_voltage_average_v AVG par('v(xc)-v(in)') ${window(0)}`,
    `.meas tran magnetizing_current_valley_a MIN i(vmag) ${timeline.lastPeriod}`,
    // The drain as the auxiliary gate starts to rise, the dead time after the main gate's fall:
    // below Vin + Vc where the auxiliary switch turns on hard.
    `.meas tran drain_voltage_at_auxiliary_gate_v FIND v(b) AT=${n((totalPeriods - 1) * periodS + onTimeS + deadS)}`,
    timeline.tranLine(onTimeS, o.stepsPerPeriod),
    '.end',
  );
  return `${lines.join('\n')}\n`;
}
