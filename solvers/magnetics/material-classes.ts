import type { MaterialClass } from './material-class.js';

/**
 * Quadratic loss factor 1 + c·(T − Tmin)², written as ct2·T² − ct1·T + ct0: minimum 1 at Tmin °C.
 */
function lossFactor(curvaturePerC2: number, minimumLossTemperatureC: number) {
  return {
    ct2: curvaturePerC2,
    ct1: 2 * curvaturePerC2 * minimumLossTemperatureC,
    ct0: 1 + curvaturePerC2 * minimumLossTemperatureC ** 2,
  };
}

/**
 * Generic core-material classes. EVERY NUMBER HERE IS INVENTED, chosen only to be representative
 * of the class (orders of magnitude of the trade); none is any product's data. Pv = k·f^α·B^β in
 * W/m³ with f in Hz and B the peak flux density in T, times the loss temperature factor.
 */
export const MATERIAL_CLASSES: readonly MaterialClass[] = [
  {
    // Invented: about 80 kW/m³ at 100 kHz, 0.1 T, 90 °C.
    id: 'mnzn-power-low-frequency',
    steinmetz: { k: 10, alpha: 1.3, beta: 2.6 },
    lossTemperatureFactor: lossFactor(1e-4, 90),
    saturation: {
      lowTemperatureC: 25,
      lowFluxDensityT: 0.5,
      highTemperatureC: 100,
      highFluxDensityT: 0.39,
    },
    initialPermeability: 2300,
    initialPermeabilityTolerance: 0.25,
    frequencyMinHz: 10e3,
    frequencyMaxHz: 200e3,
  },
  {
    // Invented: about 100 kW/m³ at 500 kHz, 50 mT, 100 °C.
    id: 'mnzn-power-high-frequency',
    steinmetz: { k: 0.5, alpha: 1.5, beta: 2.5 },
    lossTemperatureFactor: lossFactor(1.2e-4, 100),
    saturation: {
      lowTemperatureC: 25,
      lowFluxDensityT: 0.47,
      highTemperatureC: 100,
      highFluxDensityT: 0.38,
    },
    initialPermeability: 1400,
    initialPermeabilityTolerance: 0.25,
    frequencyMinHz: 100e3,
    frequencyMaxHz: 1e6,
  },
  {
    // Invented: about 190 kW/m³ at 1 MHz, 20 mT; loss varies little with temperature.
    id: 'nizn',
    steinmetz: { k: 6, alpha: 1.4, beta: 2.3 },
    lossTemperatureFactor: lossFactor(3e-5, 60),
    saturation: {
      lowTemperatureC: 25,
      lowFluxDensityT: 0.35,
      highTemperatureC: 100,
      highFluxDensityT: 0.3,
    },
    initialPermeability: 250,
    initialPermeabilityTolerance: 0.25,
    frequencyMinHz: 500e3,
    frequencyMaxHz: 10e6,
  },
  {
    // Invented: about 470 kW/m³ at 100 kHz, 50 mT; a distributed gap, so a low μi, soft saturation.
    id: 'powdered-iron',
    steinmetz: { k: 600, alpha: 1.1, beta: 2.0 },
    lossTemperatureFactor: lossFactor(1e-5, 25),
    saturation: {
      lowTemperatureC: 25,
      lowFluxDensityT: 1.2,
      highTemperatureC: 100,
      highFluxDensityT: 1.15,
    },
    initialPermeability: 75,
    initialPermeabilityTolerance: 0.1,
    frequencyMinHz: 1e3,
    frequencyMaxHz: 500e3,
  },
];
