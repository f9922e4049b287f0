/**
 * Invented material requests for the documented examples (product rule 3): loss points made up
 * to look like a power ferrite's, with a little scatter; no real material behind them.
 */
export const EXAMPLE_MATERIALS = {
  /** invented: eight loss points of a made-up lab ferrite, 50–200 kHz, 50–200 mT. */
  labFerrite: {
    name: 'invented-lab-ferrite-a',
    lossPoints: [
      { frequencyHz: 50e3, peakFluxDensityT: 0.05, lossDensityWPerM3: 8660 },
      { frequencyHz: 50e3, peakFluxDensityT: 0.1, lossDensityWPerM3: 48200 },
      { frequencyHz: 50e3, peakFluxDensityT: 0.2, lossDensityWPerM3: 294000 },
      { frequencyHz: 100e3, peakFluxDensityT: 0.05, lossDensityWPerM3: 21400 },
      { frequencyHz: 100e3, peakFluxDensityT: 0.1, lossDensityWPerM3: 131000 },
      { frequencyHz: 100e3, peakFluxDensityT: 0.2, lossDensityWPerM3: 728000 },
      { frequencyHz: 200e3, peakFluxDensityT: 0.05, lossDensityWPerM3: 55200 },
      { frequencyHz: 200e3, peakFluxDensityT: 0.1, lossDensityWPerM3: 330000 },
    ],
    saturationFluxDensityT: 0.38,
    initialPermeability: 2000,
    initialPermeabilityTolerance: 0.25,
  },
  /** invented: only two loss points, too few to fit three coefficients. */
  twoPoints: {
    name: 'invented-two-point-ferrite',
    lossPoints: [
      { frequencyHz: 100e3, peakFluxDensityT: 0.1, lossDensityWPerM3: 131000 },
      { frequencyHz: 200e3, peakFluxDensityT: 0.05, lossDensityWPerM3: 55200 },
    ],
  },
  /** invented: three points at one frequency, which cannot separate α from β. */
  oneFrequency: {
    name: 'invented-one-frequency-ferrite',
    lossPoints: [
      { frequencyHz: 100e3, peakFluxDensityT: 0.05, lossDensityWPerM3: 21400 },
      { frequencyHz: 100e3, peakFluxDensityT: 0.1, lossDensityWPerM3: 131000 },
      { frequencyHz: 100e3, peakFluxDensityT: 0.2, lossDensityWPerM3: 728000 },
    ],
  },
} as const;
