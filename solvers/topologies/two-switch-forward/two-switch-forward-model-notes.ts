/** What this version of the two-switch forward model includes and leaves out, in plain sentences. */
export const TWO_SWITCH_FORWARD_MODEL_NOTES: readonly string[] = [
  'Steady state from volt-second balance on each output inductor and on the magnetizing inductance, and charge balance on the output capacitors, with linear current ramps and the resistive drops taken at each interval’s mean current.',
  'Conduction drops inside the steady state: both switches’ on-resistance and the primary winding resistance while on; the secondary winding, forward rectifier and inductor resistance while on; the freewheeling rectifier and inductor resistance while freewheeling; rectifier forward voltages.',
  'The core resets through the two clamp diodes at the input voltage plus both diode drops, so the duty cycle is held to 0.5 (or limits.dutyCycleMax if lower) and the magnetizing current must reach zero before the next on-time; the magnetizing energy returns to the input and only the clamp diode drop is lost.',
  'Unless the spec fixes it, the magnetizing inductance is chosen so that the magnetizing current peak is 0.1 of the reflected full-load current at the lowest input, and each output inductance so that its peak-to-peak ripple at the highest input and full load is outputInductorRippleRatioTarget (0.3 when omitted) of its full-load current.',
  'Each output inductor runs continuous or discontinuous (ΔIL > 2·Io); a synchronous rectifier is taken to turn off at zero current, as a diode does. Output 0 is regulated; the other outputs follow from their turns ratio and their own drops, each with its own inductor (coupled output inductors are not modelled).',
  'The leakage inductance is in the steady state at turn-on: the switch current rises through it to the reflected valley current while both rectifiers conduct (a loss of duty cycle Llk·ΣIv/n/(Vin·T)), and during the on-time it takes Llk·di/dt of the rising primary current from the winding. Its turn-off commutation (its energy returns through the clamp or reset diode) is not modelled, nor its softer turn-on.',
  'During the idle interval after reset the switches are taken to share the input voltage equally (Vin/2 each); the ringing of the magnetizing inductance with the switch capacitances is not modelled. Turn-on overlap and output-capacitance losses use Vin/2, turn-off uses Vin plus one clamp diode drop.',
  'Diodes use a linear model; reverse recovery is Qrr·Vr·fs in continuous conduction only. Synchronous rectifiers add gate drive and body-diode conduction over the dead time on the freewheeling device.',
  'Core loss, AC winding resistance, saturation and temperature rise are not yet modelled; windings and devices are taken at the ambient temperature.',
  'Results are engineering estimates that a qualified person must verify; safety spacing and insulation follow the applicable standards, local codes and licensed practice.',
];

/** The reset-winding forward's notes: the two-switch forward's, with its own reset and switch. */
export const RESET_WINDING_FORWARD_MODEL_NOTES: readonly string[] = [
  ...TWO_SWITCH_FORWARD_MODEL_NOTES.slice(0, 2),
  'The core resets through the reset winding (Nr/Np from forward.resetTurnsRatio, 1 when omitted) and its diode at (Vin + Vf)·Np/Nr referred to the primary, so the duty cycle is held to 1/(1 + Nr/Np) (or limits.dutyCycleMax if lower) and the one switch blocks Vin + (Vin + Vf)·Np/Nr; the magnetizing energy returns to the input and only the reset diode drop is lost. The reset winding is taken as ideally coupled and without resistance.',
  ...TWO_SWITCH_FORWARD_MODEL_NOTES.slice(3, 6),
  'During the idle interval after reset the switch is taken to sit at the input voltage; the ringing of the magnetizing inductance with the switch capacitance is not modelled. Turn-on overlap and output-capacitance losses use Vin, turn-off uses Vin plus the reset voltage.',
  ...TWO_SWITCH_FORWARD_MODEL_NOTES.slice(7),
];
