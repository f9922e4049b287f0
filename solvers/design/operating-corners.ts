import type { Spec } from '../spec/spec-schema.js';
import type { OperatingCorner } from '../topologies/topology.js';

const INPUTS = [
  ['min-input', 'inputVoltageMinV'],
  ['nominal-input', 'inputVoltageNominalV'],
  ['max-input', 'inputVoltageMaxV'],
] as const;

/**
 * Returns the spec's operating corners: minimum, nominal and maximum input (in that order), each
 * with every load fraction in spec order, labelled like `min-input/100pct-load`. Always 3 × N,
 * even when two input voltages coincide, so corner indices are predictable.
 */
export function operatingCorners(spec: Spec): OperatingCorner[] {
  const corners: OperatingCorner[] = [];
  for (const [name, field] of INPUTS) {
    for (const loadFraction of spec.loadFractions) {
      corners.push({
        label: `${name}/${loadPercentLabel(loadFraction)}pct-load`,
        inputVoltageV: spec[field],
        loadFraction,
      });
    }
  }
  return corners;
}

/** The load fraction as a percentage with at most one decimal: 0.1 → '10', 0.125 → '12.5'. */
function loadPercentLabel(loadFraction: number): string {
  return String(Math.round(loadFraction * 1000) / 10);
}
