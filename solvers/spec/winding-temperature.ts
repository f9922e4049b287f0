import type { Spec } from './spec-schema.js';

/** Returns the temperature the winding resistances are taken at, °C: the spec's copper temperature, else the ambient. */
export function windingTemperatureC(spec: Spec): number {
  return spec.transformer.copperTemperatureC ?? spec.ambientTemperatureC;
}
