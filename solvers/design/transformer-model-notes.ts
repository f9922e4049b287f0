/** What the designed transformer's model includes and leaves out; appended to a design's notes. */
export const TRANSFORMER_MODEL_NOTES: readonly string[] = [
  'The transformer is designed from the catalog: the smallest core shape (by effective volume) and the material class with the least loss for which some whole-turns build keeps the window fill, the peak flux density (against saturation at the core temperature, times fluxDensityUtilizationMax) and the temperature rise inside their limits. Core dimensions are nominal and recalled: confirm them against the supplier drawing.',
  'The operating point is solved twice: first with the transformer block of the spec, then with the designed transformer fixed in it (whole turns, winding resistances at 20 °C taken at the hottest corner’s temperature, leakage from the winding geometry, and for an ungapped core the magnetizing inductance it gives).',
  'Core loss by the iGSE over each corner’s flux waveform times the material’s temperature factor; copper loss as the DC loss plus each harmonic’s loss by Dowell’s factor (from the window’s ampere-turn profile), at the corner’s own temperature. These losses replace the windings’ I²R lines and add a core line; the input supplies them, the duty cycle is not re-solved for them.',
  'Temperature rise of the wound core from its total loss and outer surface (McLyman’s natural-convection relation), one lumped temperature for core and windings, iterated with the losses. Leakage from the one-dimensional window field with one mean turn length; fringing of the gap by McLyman’s factor.',
  'Insulation between sections is functional only (three layers of tape): safety insulation, clearance and creepage for an offline design follow the applicable standard, local codes and licensed practice, and may need a larger core.',
];

/** Appended when the spec carries its material inline (magnetics.material). */
export const INLINE_MATERIAL_NOTE =
  "The core material is the spec's inline magnetics.material, used as given (its Steinmetz coefficients, loss temperature factor, saturation points and initial permeability), not a catalog class; the transformer's materialId is its id. Its frequency range is not screened against the switching frequency: a Steinmetz fit outside the range of its loss points is an extrapolation.";
