/**
 * The transformer as the converter model takes it where the spec does not have it designed
 * (magnetics.mode assume); appended instead of {@link TRANSFORMER_MODEL_NOTES}.
 */
export const ASSUMED_TRANSFORMER_MODEL_NOTE =
  'The transformer is represented by its magnetizing inductance, its primary-referred leakage inductance and the DC winding resistances of the transformer block, given at 20 °C and scaled for annealed copper (IEC 60028) to transformer.copperTemperatureC or the ambient; its core loss, AC winding resistance (skin and proximity effect), saturation and temperature rise are not modelled with the magnetics assumed (magnetics.mode design models them).';

/**
 * The output inductors of a buck-derived topology as the converter model takes them where they
 * are not designed; appended instead of {@link OUTPUT_INDUCTOR_MODEL_NOTES}.
 */
export const ASSUMED_OUTPUT_INDUCTOR_MODEL_NOTE =
  'Each output inductor is represented by its inductance and its DC resistance (outputs[].inductorResistanceOhm at 20 °C, scaled by IEC 60028 as the windings); its core loss, AC resistance, saturation and temperature rise are not modelled unless it is designed (magnetics.mode design).';

/** How the transformer is chosen when the spec fixes none of its build. */
const TRANSFORMER_CHOICE_NOTE =
  'The transformer is designed from the catalog: the smallest core shape (by effective volume) and the material class with the least loss for which some whole-turns build keeps the window fill, the peak flux density (against saturation at the core temperature, times fluxDensityUtilizationMax), the temperature rise and the winding hot spot inside their limits. Core dimensions are nominal and recalled: confirm them against the supplier drawing.';

/** The parts of the transformer's build a spec may fix (magnetics-spec-schema.ts). */
export interface FixedTransformerParts {
  coreShape?: string | undefined;
  materialId?: string | undefined;
  material?: { id: string } | undefined;
  primaryTurns?: number | undefined;
  wires?: readonly unknown[] | undefined;
}

/**
 * The transformer notes for a spec's magnetics block: the first says what was searched and what
 * the spec fixed, so a design on a named core does not read as the smallest one that fits.
 */
export function transformerModelNotes(fixed: FixedTransformerParts): readonly string[] {
  const materialId = fixed.material?.id ?? fixed.materialId;
  if (
    fixed.coreShape === undefined &&
    materialId === undefined &&
    fixed.primaryTurns === undefined &&
    fixed.wires === undefined
  ) {
    return TRANSFORMER_MODEL_NOTES;
  }
  const shape =
    fixed.coreShape === undefined
      ? 'the smallest core shape (by effective volume)'
      : `the core shape the spec names (magnetics.coreShape, ${fixed.coreShape})`;
  const material =
    materialId === undefined
      ? 'the class with the least loss for which such a build exists'
      : `the one the spec names (${materialId})`;
  const given = [
    fixed.primaryTurns === undefined ? undefined : `${fixed.primaryTurns} primary turns`,
    fixed.wires === undefined ? undefined : 'the wires',
  ].filter((part) => part !== undefined);
  const choice =
    `The transformer is designed from the catalog on ${shape}` +
    (given.length === 0 ? '' : ` with ${given.join(' and ')} as the spec fixes them`) +
    `: a whole-turns build must keep the window fill, the peak flux density (against saturation at the core temperature, times fluxDensityUtilizationMax), the temperature rise and the winding hot spot inside their limits (the design answers the limit it breaks otherwise); the material is ${material}. Core dimensions are nominal and recalled: confirm them against the supplier drawing.`;
  return [choice, ...TRANSFORMER_MODEL_NOTES.slice(1)];
}

/** What the designed transformer's model includes and leaves out; appended to a design's notes. */
export const TRANSFORMER_MODEL_NOTES: readonly string[] = [
  TRANSFORMER_CHOICE_NOTE,
  'The operating point is solved twice: first with the transformer block of the spec, then with the designed transformer fixed in it (whole turns, winding resistances at 20 °C taken at the hottest corner’s temperature, leakage from the winding geometry, and for an ungapped core the magnetizing inductance it gives).',
  'Core loss by the iGSE over each corner’s flux waveform times the material’s temperature factor; copper loss as the DC loss plus each harmonic’s loss by Dowell’s factor (from the window’s ampere-turn profile), at the corner’s own temperature. These losses replace the windings’ I²R lines and add a core line; the input supplies them, the duty cycle is not re-solved for them.',
  'Temperature rise of the wound core from its total loss and outer surface (McLyman’s natural-convection relation), one lumped temperature for core and windings, iterated with the losses. The winding’s hot spot adds the conduction rise across its build: a slab with the copper loss spread evenly, insulated on the bobbin side, ΔT = q·t²/(2k) with an effective conductivity of 0.4 W/(m·K) across the layers (a dry winding, common practice); held to hotSpotTemperatureMaxC. Leakage from the one-dimensional window field with one mean turn length; fringing of the gap by McLyman’s factor.',
  'Windings are round magnet wire (several in parallel), litz or copper foil. Where the engine chooses the wires, a winding of at most ten turns that round wire would wind in litz is also tried in foil across the window’s breadth (one turn to a layer, 50 µm of film between turns), its thickness the least-loss one over its own current by Dowell; foil is kept only where it fits when nothing else does or loses less, and is not wound on gapped cores or rings. Foil is one-dimensional in the model: the field’s bend at its edges and a gap’s fringing field are left out.',
  'Insulation between sections is functional only (three layers of tape): safety insulation, clearance and creepage for an offline design follow the applicable standard, local codes and licensed practice, and may need a larger core.',
];

/** Appended when the spec carries its material inline (magnetics.material). */
export const INLINE_MATERIAL_NOTE =
  "The core material is the spec's inline magnetics.material, used as given (its Steinmetz coefficients, loss temperature factor, saturation points and initial permeability), not a catalog class; the transformer's materialId is its id. Its frequency range is not screened against the switching frequency: a Steinmetz fit outside the range of its loss points is an extrapolation.";

/** What the designed output inductors' model includes and leaves out; appended when present. */
export const OUTPUT_INDUCTOR_MODEL_NOTES: readonly string[] = [
  'Each output inductor is designed from the catalog for the inductance the topology chose: the smallest E-type core shape (by effective volume; rings are left out, a ring takes no cut gap) and material for which some whole-turns build keeps the window fill, the peak flux density L·Ipk/(N·Amin) at the worst corner (against saturation at the core temperature, times fluxDensityUtilizationMax) and the temperature rise inside their limits; the gap is cut for the inductance with McLyman’s fringing factor. One winding of round wire (in parallel) or litz, sized by current density and the skin depth at the ripple frequency, laid in layers on the centre leg (foil only when magnetics.outputInductors fixes it: the engine winds no foil next to a gap).',
  'Core loss by the iGSE over each corner’s flux L·i(t)/(N·Ae) (the DC bias does not enter the iGSE); copper loss as the DC loss at the winding temperature plus each ripple harmonic’s loss by Dowell’s factor, with the one-dimensional field of a single winding (the gap’s fringing field near the winding is left out). Temperature from McLyman’s surface relation, iterated with the losses as for the transformer. The inductor’s DC resistance at its hottest corner replaces the spec’s inductorResistanceOhm in the second solve; its core loss is a line of its own and its copper line takes the DC-plus-AC loss. A powdered-iron core’s permeability roll-off under DC bias is not modelled.',
];
