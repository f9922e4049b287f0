import { z } from 'zod';
import { CoreGeometrySchema } from '../magnetics/catalog-schemas.js';
import {
  WOUND_CORE_FLUX_FIELDS,
  WOUND_CORE_THERMAL_FIELDS,
  WINDING_BUILD_FIELDS,
} from '../transformer/transformer-design-schema.js';

const OutputInductorCornerSchema = z.object({
  ...WOUND_CORE_FLUX_FIELDS,
  currentAverageA: z.number().describe('Average (DC) inductor current, A.'),
  currentPeakA: z.number().describe('Peak inductor current, A.'),
  currentRippleA: z.number().describe('Peak-to-peak inductor current, A.'),
  conductionMode: z
    .enum(['ccm', 'dcm'])
    .describe('Whether the inductor current stays above zero (ccm) or idles at zero (dcm).'),
  resistanceOhm: z.number().describe('DC resistance at the winding temperature, Ω.'),
  copperDcLossW: z.number().describe('Loss of the DC current in the DC resistance, W.'),
  copperAcLossW: z
    .number()
    .describe("Loss of the ripple harmonics, Dowell's factor per harmonic, W."),
  ...WOUND_CORE_THERMAL_FIELDS,
});

/** One designed output inductor in a design: what to wind, and how it fares at every corner. */
export const OutputInductorDesignSchema = z
  .object({
    outputIndex: z.int().describe('Which output it filters (0-based, as in spec.outputs).'),
    name: z.string().describe('Its name in each corner’s loss list (copper and core lines).'),
    coreShape: z.string().describe('Catalog designation of the core shape (nominal dimensions).'),
    core: CoreGeometrySchema,
    materialId: z.string().describe('Id of the core material.'),
    gapLengthM: z
      .number()
      .describe('Total air gap in the magnetic path, m, cut for the inductance with fringing.'),
    inductanceH: z
      .number()
      .describe(
        'Inductance the gapped core gives, H (the topology’s choice, which it is cut for).',
      ),
    inductanceTolerance: z
      .object({
        gapToleranceM: z.number().describe('Tolerance assumed on the ground gap (±), in m.'),
        permeabilityTolerance: z
          .number()
          .describe('Relative tolerance of the material’s initial permeability, ±.'),
        worstCase: z.number().describe('Worst-case relative inductance tolerance, ±.'),
        rss: z.number().describe('Root-sum-square relative inductance tolerance, ±.'),
      })
      .describe('First-order spread of the inductance from the gap and the material.'),
    ...WINDING_BUILD_FIELDS,
    dowellLayerCount: z.number().describe("Dowell's layer count of the winding."),
    windowFill: z.number().describe('Outside area of all turns over the window area.'),
    windowHeightFill: z.number().describe('Height of the winding over the window width.'),
    corners: z.array(OutputInductorCornerSchema),
    summary: z.object({
      currentPeakMaxA: z.number().describe('Largest peak current over the corners, A.'),
      worstCorner: z.string().describe('The corner of the largest flux-density utilization.'),
      peakFluxDensityMaxT: z.number().describe('Largest peak flux density over the corners, T.'),
      fluxDensityUtilizationMax: z
        .number()
        .describe('Largest peak flux density over saturation at the core temperature.'),
      saturationMargin: z
        .number()
        .describe(
          'Share of the saturation flux density left unused at the worst corner: 1 − fluxDensityUtilizationMax.',
        ),
      temperatureRiseMaxK: z.number().describe('Largest temperature rise over the corners, K.'),
      lossMaxW: z.number().describe('Largest inductor loss over the corners, W.'),
    }),
  })
  .describe(
    'An output inductor the engine designed: a gapped core from the catalog, its winding, and its losses and temperature at every corner. Core dimensions are nominal and recalled; confirm them against the supplier drawing.',
  );

/** A designed output inductor as a design carries it. */
export type OutputInductorDesign = z.infer<typeof OutputInductorDesignSchema>;
