import type { DoubleEndedKind } from './primary-bridge.js';

const PRIMARY: Readonly<Record<DoubleEndedKind, string>> = {
  'push-pull':
    'Push-pull: a center-tapped primary, each half driven in turn by its switch at the input voltage; each switch blocks the input plus the other half’s voltage (about 2·Vin) while the other half is driven, and Vin while both are off. The turns ratio, the magnetizing inductance and primaryResistanceOhm refer to one primary half. The leakage energy ½·Llk·I² at each turn-off is taken as dissipated in a clamp or snubber (its spike above 2·Vin is not modelled).',
  'half-bridge':
    'Half bridge: two switches and a capacitor divider that holds the winding’s far end at Vin/2 (taken as ideal: no divider ripple), so the winding sees ±Vin/2 and each switch blocks Vin. The input capacitor figure is the RMS ripple current of each divider capacitor. The leakage energy returns to the input through the body diodes at turn-off (not lost).',
  'full-bridge':
    'Full bridge, hard-switched with symmetric duty: two diagonal switch pairs drive the winding at ±Vin, two switches in series with it; each switch blocks Vin. The leakage energy returns to the input through the body diodes at turn-off (not lost).',
};

const SHARED: readonly string[] = [
  'Duty cycle D is each switch’s on-time over the switching period (0 < D ≤ 0.5; Mohan, Undeland, Robbins’ convention); the output inductor sees 2·D at twice the switching frequency, so the lossless conversion ratio is Vo = 2·D·Vd/n with Vd the winding drive voltage. The duty cycle is held to the lower of limits.dutyCycleMax and 0.5 (the two halves must not overlap).',
  'Steady state from volt-second balance on each output inductor (over half a period) and on the magnetizing inductance (over the whole period: ±Vp for equal times, so the magnetizing current swings symmetrically between −Im,pk and +Im,pk with no DC), and charge balance on the output capacitors, with linear ramps and the resistive drops at each interval’s mean current. Perfect flux balance is assumed: unequal switch drops or timing that would walk the flux are not modelled.',
  'Each output is center-tapped (two rectifiers; secondaryArrangement default) or a full-bridge rectifier (four). Center-tapped: one rectifier and one secondary half conduct while driven, each blocking twice the secondary voltage; both share the inductor current while freewheeling. Bridge: two rectifiers and the winding conduct while driven, the other two each block the secondary voltage; all four share the current while freewheeling, two in series. While freewheeling the winding is taken to sit at zero and the magnetizing current to hold its peak, carried by the rectifiers (their currents leave that share out). That holds while the inductor current exceeds the magnetizing current referred to the secondary; below it (very light load, discontinuous conduction) one rectifier stops, the magnetizing current holds the inductor current up, and the output voltage runs above the estimate (by several percent at 10 % load with the default magnetizing inductance; a larger magnetizingInductanceH in the spec narrows it).',
  'Unless the spec fixes it, the turns ratio gives targets.dutyCycleTarget at the lowest input and full load with every drop; the magnetizing inductance gives a magnetizing peak of 0.1 of the reflected full-load current at the lowest input (common practice); each output inductance gives the ripple target (0.3 of full load when omitted) at the highest input and full load.',
  'Each output inductor runs continuous or discontinuous (ΔIL > 2·Io over its half-period); a synchronous rectifier is taken to turn off at zero current, as a diode does. Output 0 is regulated; the other outputs follow from their turns ratio and their own drops.',
  'The leakage inductance is in the steady state at turn-on: the primary current rises through it from zero to the reflected valley less the magnetizing peak while every rectifier conducts (a loss of duty cycle), and during the on-time it takes Llk·di/dt of the rising primary current. Its turn-off commutation is not modelled.',
  'Switch losses: conduction, turn-on overlap and output-capacitance discharge from the idle voltage (Vin for the push-pull, Vin/2 for the bridges, whose equal switch capacitances are taken to share the input while all switches are off), turn-off overlap into Vin at the peak current, gate drive. Diodes use a linear model with recovery Qrr·Vr·fs per rectifier in continuous conduction; synchronous rectifiers add gate drive and body-diode conduction over the dead times at four edges a period.',
  'Core loss, AC winding resistance, saturation and temperature rise are not yet modelled; windings and devices are taken at the ambient temperature. A current-doubler secondary is not offered.',
  'Results are engineering estimates that a qualified person must verify; safety spacing and insulation follow the applicable standards, local codes and licensed practice.',
];

/** What this version of a double-ended model includes and leaves out, in plain sentences. */
export function doubleEndedModelNotes(kind: DoubleEndedKind): readonly string[] {
  return [PRIMARY[kind], ...SHARED];
}
