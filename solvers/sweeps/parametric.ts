import { cornerConductionMode } from '../design/corner-conduction-mode.js';
import type { Corner, Design } from '../design/design-schema.js';
import { success, type Result } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';
import { topologyById } from '../topologies/index.js';
import {
  cornersWithMagnetics,
  fixMagnetics,
  type FixedMagnetics,
} from '../design/magnetics-pass.js';
import { solveEveryCorner, type AnyTopology } from '../design/transformer-pass.js';
import type { SweepRequest, SweepRow } from './sweep-request-schema.js';

/** One grid point of a parametric sweep. */
export interface SweepPoint {
  switchingFrequencyHz: number;
  inputVoltageV: number;
  loadFraction: number;
}

/** What a sweep solves every point of one switching frequency with. */
export interface SweepFrequencyPlan {
  /** The spec at that frequency, with its designed magnetics fixed in when it has them. */
  spec: Spec;
  choices: Design['choices'];
  magnetics?: FixedMagnetics;
}

/**
 * Choices (and the transformer) already made per switching frequency (Hz), so a sweep designs
 * once per frequency rather than once per point. Private to one request; never crosses the queue.
 */
export type SweepChoiceCache = Map<number, Result<SweepFrequencyPlan>>;

/** The three axes of the grid with the spec's values filled in where the request omits one. */
function sweepAxes(request: SweepRequest): {
  switchingFrequenciesHz: number[];
  inputVoltagesV: number[];
  loadFractions: number[];
} {
  const { spec, grid } = request;
  // Minimum, nominal and maximum input; a repeated value (a fixed-input spec) is one point.
  const specVoltagesV = [
    ...new Set([spec.inputVoltageMinV, spec.inputVoltageNominalV, spec.inputVoltageMaxV]),
  ];
  return {
    switchingFrequenciesHz: grid.switchingFrequenciesHz ?? [spec.switchingFrequencyHz],
    inputVoltagesV: grid.inputVoltagesV ?? specVoltagesV,
    loadFractions: grid.loadFractions ?? spec.loadFractions,
  };
}

/** Number of grid points `sweepPoints(request)` yields (the product of the axis lengths). */
export function sweepPointCount(request: SweepRequest): number {
  const axes = sweepAxes(request);
  return (
    axes.switchingFrequenciesHz.length * axes.inputVoltagesV.length * axes.loadFractions.length
  );
}

/**
 * Every grid point of the request, in row order: switching frequency outermost, then input
 * voltage, then load fraction (each axis in the order given, or the spec's own values).
 */
export function sweepPoints(request: SweepRequest): SweepPoint[] {
  const axes = sweepAxes(request);
  const points: SweepPoint[] = [];
  for (const switchingFrequencyHz of axes.switchingFrequenciesHz) {
    for (const inputVoltageV of axes.inputVoltagesV) {
      for (const loadFraction of axes.loadFractions) {
        points.push({ switchingFrequencyHz, inputVoltageV, loadFraction });
      }
    }
  }
  return points;
}

/**
 * The grid points [start, start + count) in row order, as `sweepPoints(request).slice(start,
 * start + count)` but without building the whole grid (a chunk of a large sweep needs only its
 * own). Throws RangeError for a range outside the grid.
 */
export function sweepPointRange(request: SweepRequest, start: number, count: number): SweepPoint[] {
  const { switchingFrequenciesHz, inputVoltagesV, loadFractions } = sweepAxes(request);
  const total = switchingFrequenciesHz.length * inputVoltagesV.length * loadFractions.length;
  if (!Number.isInteger(start) || !Number.isInteger(count) || start < 0 || count < 0) {
    throw new RangeError(`sweepPointRange: bad range start ${start}, count ${count}`);
  }
  if (start + count > total) {
    throw new RangeError(`sweepPointRange: [${start}, ${start + count}) outside ${total} points`);
  }
  const perFrequency = inputVoltagesV.length * loadFractions.length;
  const points: SweepPoint[] = [];
  for (let index = start; index < start + count; index += 1) {
    const within = index % perFrequency;
    const switchingFrequencyHz = switchingFrequenciesHz[Math.floor(index / perFrequency)];
    const inputVoltageV = inputVoltagesV[Math.floor(within / loadFractions.length)];
    const loadFraction = loadFractions[within % loadFractions.length];
    if (
      switchingFrequencyHz === undefined ||
      inputVoltageV === undefined ||
      loadFraction === undefined
    ) {
      throw new RangeError(`sweepPointRange: lost point ${index}`);
    }
    points.push({ switchingFrequencyHz, inputVoltageV, loadFraction });
  }
  return points;
}

/** The spec of one sweep frequency: the base spec with only its switching frequency replaced. */
function specAtFrequency(spec: Spec, switchingFrequencyHz: number): Spec {
  return { ...spec, switchingFrequencyHz };
}

/**
 * Designs what every point of one frequency shares, as a design would: the topology's choices,
 * and with magnetics.mode 'design' the transformer for the spec's corners, fixed into the spec
 * (so a sweep row equals the design's corner at the same point).
 */
function frequencyPlan(topology: AnyTopology, spec: Spec): Result<SweepFrequencyPlan> {
  if (spec.magnetics.mode !== 'design' || topology.transformerDuty === undefined) {
    const choices = topology.choose(spec);
    return choices.ok ? success({ spec, choices: choices.value }) : choices;
  }
  const first = solveEveryCorner(topology, spec);
  if (!first.ok) return first;
  const fixed = fixMagnetics(topology, spec, first.value);
  if (!fixed.ok) return fixed;
  if (fixed.value === undefined) return success({ spec, choices: first.value.choices });
  const choices = topology.choose(fixed.value.spec);
  if (!choices.ok) return choices;
  return success({ spec: fixed.value.spec, choices: choices.value, magnetics: fixed.value });
}

/** Largest value of `pick` over the devices, so multi-switch topologies report their worst one. */
function largest(
  devices: Corner['switches'],
  pick: (device: Corner['switches'][number]) => number,
) {
  return devices.reduce((worst, device) => Math.max(worst, pick(device)), 0);
}

/**
 * Evaluates one grid point: re-makes the topology's choices at the point's frequency (cached per
 * frequency in `cache`), solves that operating corner, and returns its row. A point whose choice
 * or corner is infeasible is a row with `feasible: false` and the engine's issues.
 */
export function evaluateSweepPoint(
  request: SweepRequest,
  point: SweepPoint,
  cache: SweepChoiceCache = new Map(),
): SweepRow {
  const spec = specAtFrequency(request.spec, point.switchingFrequencyHz);
  const topology = topologyById(spec.topology);
  let plan = cache.get(point.switchingFrequencyHz);
  if (plan === undefined) {
    plan = frequencyPlan(topology, spec);
    cache.set(point.switchingFrequencyHz, plan);
  }
  const base = {
    inputVoltageV: point.inputVoltageV,
    loadFraction: point.loadFraction,
    switchingFrequencyHz: point.switchingFrequencyHz,
  };
  if (!plan.ok) return { ...base, feasible: false, issues: plan.issues };
  const { choices, magnetics } = plan.value;
  const solved = topology.solveCorner(plan.value.spec, choices, {
    label: `input-${point.inputVoltageV}V/load-${point.loadFraction}`,
    inputVoltageV: point.inputVoltageV,
    loadFraction: point.loadFraction,
  });
  if (!solved.ok) return { ...base, feasible: false, issues: solved.issues };
  const corner =
    magnetics === undefined
      ? solved.value
      : cornersWithMagnetics(topology, magnetics, choices, [solved.value]).corners[0];
  if (corner === undefined) throw new Error('evaluateSweepPoint: lost the corner');
  const row: SweepRow = {
    ...base,
    feasible: true,
    conductionMode: cornerConductionMode(corner),
    dutyCycle: corner.dutyCycle,
    efficiency: corner.efficiency,
    lossTotalW: corner.lossTotalW,
    switchVoltagePeakV: largest(corner.switches, (device) => device.voltagePeakV),
    switchCurrentPeakA: largest(corner.switches, (device) => device.currentPeakA),
  };
  for (const [name, value] of Object.entries(row)) {
    if (typeof value === 'number' && !Number.isFinite(value)) {
      throw new RangeError(`evaluateSweepPoint: non-finite ${name} at ${JSON.stringify(point)}`);
    }
  }
  return row;
}
