import { z } from 'zod';
import { CoreGeometrySchema } from '../magnetics/catalog-schemas.js';

/** The conductor of a winding: round magnet wire (several in parallel), litz or foil. */
export const WireSchema = z
  .discriminatedUnion('kind', [
    z.object({
      kind: z.literal('round'),
      awg: z.int().describe('AWG size of each wire (ASTM B258).'),
      parallelCount: z.int().describe('Wires in parallel, side by side in the layer.'),
    }),
    z.object({
      kind: z.literal('litz'),
      strandAwg: z.int().describe('AWG size of each strand (ASTM B258).'),
      strandCount: z.int().describe('Strands in the bundle.'),
    }),
    z.object({
      kind: z.literal('foil'),
      thicknessM: z.number().describe('Copper thickness across the window, m.'),
      widthM: z
        .number()
        .describe('Copper width along the leg, m (one turn to a layer; porosity widthM/breadth).'),
      insulationThicknessM: z.number().describe('Insulating film between successive turns, m.'),
    }),
  ])
  .describe('The conductor of a winding.');

/** What every designed winding (of a transformer or an inductor) reports of its build. */
export const WINDING_BUILD_FIELDS = {
  turns: z.int().describe('Turns (whole).'),
  wire: WireSchema,
  turnsPerLayer: z.int().describe('Turns side by side in a full layer.'),
  layerCount: z.int().describe('Layers across the window.'),
  heightM: z.number().describe('Height of the winding across the window, m.'),
  resistanceAt20COhm: z.number().describe('DC resistance at 20 °C (IEC 60028), Ω.'),
};

const TransformerWindingSchema = z.object({
  name: z.string().describe('Which winding, as in the corner loss list.'),
  ...WINDING_BUILD_FIELDS,
  dowellLayerCount: z
    .number()
    .describe("Dowell's equivalent layer count from the window's ampere-turn profile."),
});

/**
 * The fields every designed wound core (transformer or inductor) reports at a corner, before its
 * copper split: flux, saturation and core loss.
 */
export const WOUND_CORE_FLUX_FIELDS = {
  label: z.string().describe('The converter corner.'),
  peakFluxDensityT: z.number().describe('Largest |B| in the smallest section, T.'),
  fluxDensitySwingT: z.number().describe('Peak-to-peak flux density, T.'),
  saturationFluxDensityT: z
    .number()
    .describe('Saturation flux density of the material at the core temperature, T.'),
  fluxDensityUtilization: z.number().describe('peakFluxDensityT / saturationFluxDensityT.'),
  coreLossW: z.number().describe('Core loss by the iGSE over the flux waveform, W.'),
};

/** The fields every designed wound core reports at a corner after its copper: total and heat. */
export const WOUND_CORE_THERMAL_FIELDS = {
  totalLossW: z.number().describe('Core plus copper loss, W.'),
  temperatureRiseK: z.number().describe('Rise of the wound core above the ambient, K.'),
  temperatureC: z.number().describe('Core and winding temperature, °C.'),
};

const TransformerCornerSchema = z.object({
  ...WOUND_CORE_FLUX_FIELDS,
  copperLossW: z.number().describe('Copper loss of every winding, DC and AC, W.'),
  windings: z.array(
    z.object({
      resistanceOhm: z.number().describe('DC resistance at the winding temperature, Ω.'),
      dcLossW: z.number().describe('Loss of the DC component, W.'),
      acLossW: z.number().describe("Loss of the harmonics, Dowell's factor per harmonic, W."),
    }),
  ),
  ...WOUND_CORE_THERMAL_FIELDS,
  hotSpotRiseK: z
    .number()
    .describe(
      "Conduction rise of the winding's hottest point over temperatureC, K: the winding build as a slab with uniform copper loss, insulated on the bobbin side (q·t²/(2k)).",
    ),
  hotSpotTemperatureC: z
    .number()
    .describe(
      'Estimated winding hot-spot temperature, temperatureC + hotSpotRiseK, °C; held to magnetics.hotSpotTemperatureMaxC.',
    ),
});

/** The designed transformer in a design: what to wind, and how it fares at every corner. */
export const TransformerDesignSchema = z
  .object({
    coreShape: z.string().describe('Catalog designation of the core shape (nominal dimensions).'),
    core: CoreGeometrySchema,
    materialId: z
      .string()
      .describe(
        'Id of the core material: a built-in class, a user material, or the spec’s inline material.',
      ),
    arrangement: z.enum(['stacked', 'interleaved']).describe('How the windings are stacked.'),
    gapLengthM: z.number().describe('Total air gap in the magnetic path, m (0: ungapped).'),
    magnetizingInductanceH: z
      .number()
      .describe('Magnetizing inductance the wound core gives, referred to the primary, H.'),
    leakageInductanceH: z
      .number()
      .describe('Leakage inductance from the winding geometry, referred to the primary, H.'),
    windowFill: z.number().describe('Outside area of all turns over the window area.'),
    windowHeightFill: z.number().describe('Height of the winding stack over the window width.'),
    windings: z.array(TransformerWindingSchema),
    corners: z.array(TransformerCornerSchema),
    summary: z.object({
      peakFluxDensityMaxT: z.number().describe('Largest peak flux density over the corners, T.'),
      fluxDensityUtilizationMax: z
        .number()
        .describe('Largest peak flux density over saturation, over the corners.'),
      temperatureRiseMaxK: z.number().describe('Largest temperature rise over the corners, K.'),
      hotSpotTemperatureMaxC: z
        .number()
        .describe('Highest estimated winding hot-spot temperature over the corners, °C.'),
      lossMaxW: z.number().describe('Largest transformer loss over the corners, W.'),
    }),
  })
  .describe(
    'The transformer the engine designed. Core dimensions are nominal and recalled; confirm them against the supplier drawing. Insulation shown is functional only: safety insulation, clearance and creepage follow the applicable standard.',
  );

/** A designed transformer as a design carries it. */
export type TransformerDesign = z.infer<typeof TransformerDesignSchema>;
