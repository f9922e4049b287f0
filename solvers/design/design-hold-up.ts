import { success, type Result } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';
import { holdUpVoltages } from '../spec/hold-up-voltages.js';
import type { Topology } from '../topologies/topology.js';
import type { AnyCorner, Design } from './design-schema.js';
import type { HoldUpDesign } from './hold-up-design-schema.js';
import { holdUpCapacitance } from './hold-up-capacitance.js';

const FULL_LOAD = 1;

const SPEC_INPUTS = [
  ['min-input', 'inputVoltageMinV'],
  ['nominal-input', 'inputVoltageNominalV'],
  ['max-input', 'inputVoltageMaxV'],
] as const;

/**
 * Sizes the bulk capacitor for the spec's hold-up requirement: the converter, with the design's
 * choices, is solved at full load at the end and start voltages and at each spec input voltage
 * between them; the largest input power of those points is drawn from the capacitor for the
 * whole time; `finishCorner` adds what the design adds to a solved corner (the designed
 * transformer's losses). A point at the input voltage of one of `corners` (the design's own,
 * finished) at full load is that corner, not solved again: with the default voltages (nominal
 * down to minimum input) and a full-load fraction, every point is. Returns undefined when the
 * spec has no holdUp, the issues of any point the converter cannot run at full load.
 */
export function designHoldUp(
  spec: Spec,
  topology: Topology<Design['choices'], AnyCorner>,
  choices: Design['choices'],
  finishCorner: (corner: AnyCorner) => AnyCorner = (corner) => corner,
  corners: readonly AnyCorner[] = [],
): Result<HoldUpDesign | undefined> {
  if (spec.holdUp === undefined) return success(undefined);
  const { timeS } = spec.holdUp;
  const { startVoltageV, endVoltageV, origins } = holdUpVoltages(spec.holdUp, spec);
  const points = [
    { label: 'hold-up-end/100pct-load', inputVoltageV: endVoltageV },
    ...SPEC_INPUTS.filter(
      ([, field]) => spec[field] > endVoltageV && spec[field] < startVoltageV,
    ).map(([name, field]) => ({ label: `${name}/100pct-load`, inputVoltageV: spec[field] })),
    { label: 'hold-up-start/100pct-load', inputVoltageV: startVoltageV },
  ];
  // Input power is not monotonic in input voltage in general (conduction loss falls and
  // switching loss rises with it), so the largest of the points is taken, not the end's.
  let inputPowerW = -Infinity;
  let inputPowerAtVoltageV = endVoltageV;
  for (const point of points) {
    // A corner's numbers depend on its voltage and load alone (its label only names it).
    let corner = corners.find(
      (known) => known.inputVoltageV === point.inputVoltageV && known.loadFraction === FULL_LOAD,
    );
    if (corner === undefined) {
      const solved = topology.solveCorner(spec, choices, { ...point, loadFraction: FULL_LOAD });
      if (!solved.ok) return solved;
      corner = finishCorner(solved.value);
    }
    if (corner.inputPowerW > inputPowerW) {
      inputPowerW = corner.inputPowerW;
      inputPowerAtVoltageV = point.inputVoltageV;
    }
  }
  return success({
    timeS,
    startVoltageV,
    endVoltageV,
    inputPowerW,
    inputPowerAtVoltageV,
    energyJ: inputPowerW * timeS,
    bulkCapacitanceF: holdUpCapacitance({ powerW: inputPowerW, timeS, startVoltageV, endVoltageV }),
    origins,
  });
}
