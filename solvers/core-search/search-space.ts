import { coreGeometry } from '../magnetics/core-geometry.js';
import { CORE_SHAPE_CATALOG } from '../magnetics/core-shape-catalog.js';
import type { CoreShape } from '../magnetics/core-shape.js';
import type { MaterialClass } from '../magnetics/material-class.js';
import { MATERIAL_CLASSES } from '../magnetics/material-classes.js';
import type { Issue } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';
import { topologyById } from '../topologies/index.js';
import { solveEveryCorner, type AnyTopology } from '../design/transformer-pass.js';
import { transformerRequestFromSpec } from '../design/transformer-request-from-spec.js';
import type { WindingArrangement } from '../transformer/transformer-build.js';
import type { TransformerDuty } from '../transformer/transformer-duty.js';
import {
  TRANSFORMER_EVALUATION_DEFAULTS,
  type TransformerEvaluationOptions,
} from '../transformer/transformer-evaluation-options.js';
import { windingWireChoice } from '../transformer/winding-wire-choice.js';
import { wireDimensions, type WindingWire } from '../transformer/winding-wire.js';
import { peak } from '../waveform/peak.js';
import { minimum } from '../waveform/minimum.js';
import { rms } from '../waveform/rms.js';
import { canonicalJson } from '../versioning/canonical-json.js';
import type { CoreSearchRequest } from './core-search-request-schema.js';
import { saturationLimitT } from './candidate-bounds.js';
import { ringNeedsCutGapIssue, shapesForGap } from '../transformer/shapes-for-gap.js';

/**
 * One value of the gap dimension: none (an ungapped core, Lm what the core gives), the gap cut
 * for a magnetizing inductance, or an explicit gap length.
 */
export type GapStep =
  | { kind: 'ungapped' }
  | { kind: 'inductance'; magnetizingInductanceH: number }
  | { kind: 'length'; gapLengthM: number };

/** The enumerated space at one switching frequency. */
export interface FrequencySpace {
  frequencyHz: number;
  /** The request's spec at this frequency, magnetics.mode 'design'. */
  spec: Spec;
  topology: AnyTopology;
  /** Why the converter cannot be solved at this frequency (then it enumerates nothing). */
  issues?: Issue[];
  gapRole: TransformerDuty['gapRole'];
  windingNames: string[];
  shapes: CoreShape[];
  materials: MaterialClass[];
  /** First primary turn count of each shape. */
  turnsStart: number[];
  turnsCount: number;
  gaps: GapStep[];
  /** Wire options of each winding, primary first. */
  wireOptions: WindingWire[][];
  arrangements: WindingArrangement[];
  /** Radices below the shape: material, turns, gap, each winding's wire, arrangement. */
  radices: number[];
  /** Candidates per shape (one block). */
  blockSize: number;
  /** Index of this frequency's first candidate. */
  offset: number;
  /** Candidates at this frequency. */
  count: number;
}

/** The whole enumerated space of a request. */
export interface CoreSearchSpace {
  frequencies: FrequencySpace[];
  total: number;
  /** The evaluation settings with the spec's limits. */
  settings: Required<TransformerEvaluationOptions>;
}

const ARRANGEMENT_ORDER: readonly WindingArrangement[] = ['interleaved', 'stacked'];

/** Spaces resolved lately, by the canonical JSON of their request (most recent last). */
const RECENT_SPACES = new Map<string, CoreSearchSpace>();
const RECENT_SPACES_MAX = 4;

/**
 * {@link resolveSearchSpace}, kept for the few requests seen last: a worker runs chunk after
 * chunk of one job, each decoded afresh from the queue, and the space (with what is cached on
 * it, such as the first passes) is the same for all. The space is a pure function of the
 * request, so sharing it changes nothing in any chunk's output; callers must not mutate it.
 */
export function searchSpaceOf(request: CoreSearchRequest): CoreSearchSpace {
  const key = canonicalJson(request);
  let space = RECENT_SPACES.get(key);
  if (space === undefined) {
    space = resolveSearchSpace(request);
    if (RECENT_SPACES.size >= RECENT_SPACES_MAX) {
      RECENT_SPACES.delete(RECENT_SPACES.keys().next().value as string);
    }
  } else {
    RECENT_SPACES.delete(key);
  }
  RECENT_SPACES.set(key, space);
  return space;
}

/**
 * Resolves every dimension of the request's search (defaults included) into concrete lists, one
 * space per switching frequency. Solves the converter once per frequency with the spec's own
 * choices (the defaults for turns, gaps and wires are read off it). Deterministic in the request.
 * @throws RangeError when `space.wires` does not have one entry per transformer winding, or the
 * topology has no transformer duty.
 */
export function resolveSearchSpace(request: CoreSearchRequest): CoreSearchSpace {
  const { spec, space } = request;
  const settings = {
    ...TRANSFORMER_EVALUATION_DEFAULTS,
    windowFillMax: spec.magnetics.windowFillMax,
    fluxDensityUtilizationMax: spec.magnetics.fluxDensityUtilizationMax,
    temperatureRiseMaxK: spec.magnetics.temperatureRiseMaxK,
  };
  const frequencies = [
    ...new Set(space.switchingFrequenciesHz ?? [spec.switchingFrequencyHz]),
  ].sort((a, b) => a - b);
  const topology = topologyById(spec.topology) as AnyTopology;
  const dutyOf = topology.transformerDuty;
  if (dutyOf === undefined) {
    throw new RangeError(`core-search: topology '${spec.topology}' has no transformer duty`);
  }
  let offset = 0;
  const spaces: FrequencySpace[] = [];
  for (const frequencyHz of frequencies) {
    const specF: Spec = {
      ...spec,
      switchingFrequencyHz: frequencyHz,
      magnetics: { ...spec.magnetics, mode: 'design' },
    };
    const empty = (issues: Issue[]): FrequencySpace => ({
      frequencyHz,
      spec: specF,
      topology,
      issues,
      gapRole: 'ungapped',
      windingNames: [],
      shapes: [],
      materials: [],
      turnsStart: [],
      turnsCount: 0,
      gaps: [],
      wireOptions: [],
      arrangements: [],
      radices: [],
      blockSize: 0,
      offset,
      count: 0,
    });
    const base = solveEveryCorner(topology, specF);
    if (!base.ok) {
      spaces.push(empty(base.issues));
      continue;
    }
    const solvedDuty = dutyOf(specF, base.value.choices, base.value.corners);
    const duty: TransformerDuty =
      specF.transformer.magnetizingInductanceH === undefined
        ? solvedDuty
        : { ...solvedDuty, gapRole: 'set-inductance' };
    const requested = transformerRequestFromSpec(specF);
    if (!requested.ok) {
      spaces.push(empty(requested.issues));
      continue;
    }
    const shapes = shapesForGap(shapesOf(request, specF), duty.gapRole);
    if (shapes.length === 0) {
      const path =
        request.space.coreShapes === undefined
          ? ['spec', 'magnetics', 'coreShape']
          : ['space', 'coreShapes'];
      spaces.push(empty([ringNeedsCutGapIssue(path)]));
      continue;
    }
    const materials = materialsOf(request, requested.value.materials);
    const gaps = gapsOf(request, duty);
    const wireOptions = wiresOf(request, duty, frequencyHz);
    const arrangements = ARRANGEMENT_ORDER.filter((a) => space.arrangements.includes(a));
    const { turnsStart, turnsCount } = turnsOf(request, duty, shapes, materials, settings);
    const radices = [
      materials.length,
      turnsCount,
      gaps.length,
      ...wireOptions.map((options) => options.length),
      arrangements.length,
    ];
    const blockSize = radices.reduce((product, radix) => product * radix, 1);
    const count = blockSize * shapes.length;
    spaces.push({
      frequencyHz,
      spec: specF,
      topology,
      gapRole: duty.gapRole,
      windingNames: duty.windings.map((winding) => winding.name),
      shapes,
      materials,
      turnsStart,
      turnsCount,
      gaps,
      wireOptions,
      arrangements,
      radices,
      blockSize,
      offset,
      count,
    });
    offset += count;
  }
  if (!Number.isSafeInteger(offset)) {
    throw new RangeError(`core-search: the space has ${offset} candidates, beyond counting`);
  }
  return { frequencies: spaces, total: offset, settings };
}

function shapesOf(request: CoreSearchRequest, spec: Spec): CoreShape[] {
  const wanted =
    request.space.coreShapes ??
    (spec.magnetics.coreShape === undefined ? undefined : [spec.magnetics.coreShape]);
  return CORE_SHAPE_CATALOG.filter(
    (shape) => wanted === undefined || wanted.includes(shape.designation),
  );
}

function materialsOf(
  request: CoreSearchRequest,
  defaults: readonly MaterialClass[],
): MaterialClass[] {
  const ids = request.space.materialIds;
  if (ids === undefined) return [...defaults];
  const inline = request.spec.magnetics.material;
  const known = inline === undefined ? MATERIAL_CLASSES : [inline, ...MATERIAL_CLASSES];
  // Catalog order (the inline material first), whatever the request's order and repeats.
  return known.filter(
    (material, i) =>
      ids.includes(material.id) && known.findIndex((m) => m.id === material.id) === i,
  );
}

function gapsOf(request: CoreSearchRequest, duty: TransformerDuty): GapStep[] {
  if (duty.gapRole === 'ungapped') return [{ kind: 'ungapped' }];
  const gaps = request.space.gaps;
  if (gaps.kind === 'lengths') {
    return [...new Set(gaps.lengthsM)]
      .sort((a, b) => a - b)
      .map((gapLengthM) => ({ kind: 'length', gapLengthM }));
  }
  const { stepCount, factorMin, factorMax } = gaps;
  const steps: GapStep[] = [];
  for (let i = 0; i < stepCount; i++) {
    // Geometric steps; one step is the target itself.
    const factor =
      stepCount === 1 ? 1 : factorMin * (factorMax / factorMin) ** (i / (stepCount - 1));
    steps.push({
      kind: 'inductance',
      magnetizingInductanceH:
        factor === 1 ? duty.magnetizingInductanceH : factor * duty.magnetizingInductanceH,
    });
  }
  return steps;
}

function wiresOf(
  request: CoreSearchRequest,
  duty: TransformerDuty,
  frequencyHz: number,
): WindingWire[][] {
  const given = request.space.wires;
  if (given !== undefined) {
    if (given.length !== duty.windings.length) {
      throw new RangeError(
        `core-search: space.wires has ${given.length} windings, the ${duty.windings.length} windings of this design are ${duty.windings.map((w) => w.name).join(', ')}`,
      );
    }
    return given.map((options) => uniqueWires(options));
  }
  const densityAPerM2 = request.spec.magnetics.currentDensityAPerM2;
  const factors = [...new Set(request.space.wireCurrentDensityFactors)].sort((a, b) => a - b);
  return duty.windings.map((winding) => {
    const currentRmsA = Math.max(...winding.currentsA.map((current) => rms(current)), 1e-6);
    // Thickest first: the lowest current density gives the most copper.
    return uniqueWires(
      factors.map((factor) =>
        windingWireChoice(currentRmsA, frequencyHz, {
          currentDensityAPerM2: densityAPerM2 * factor,
        }),
      ),
    );
  });
}

function uniqueWires(wires: readonly WindingWire[]): WindingWire[] {
  const seen = new Set<string>();
  const out: WindingWire[] = [];
  for (const wire of wires) {
    const key = JSON.stringify(
      wire.kind === 'round'
        ? [wire.kind, wire.awg, wire.parallelCount]
        : [wire.kind, wire.strandAwg, wire.strandCount],
    );
    if (seen.has(key)) continue;
    wireDimensions(wire); // throws a RangeError for a wire the catalog does not hold
    seen.add(key);
    out.push(wire);
  }
  return out;
}

/** Largest flux linkage Lm·|im| over the corners of a duty, Wb (per primary turn: ×1/Np). */
export function fluxLinkageWb(duty: TransformerDuty): number {
  let most = 0;
  for (const current of duty.magnetizingCurrentsA) {
    most = Math.max(most, peak(current), -minimum(current));
  }
  return duty.magnetizingInductanceH * most;
}

function turnsOf(
  request: CoreSearchRequest,
  duty: TransformerDuty,
  shapes: readonly CoreShape[],
  materials: readonly MaterialClass[],
  settings: Required<TransformerEvaluationOptions>,
): { turnsStart: number[]; turnsCount: number } {
  const range = request.space.primaryTurns;
  if (range !== undefined) {
    return { turnsStart: shapes.map(() => range.min), turnsCount: range.max - range.min + 1 };
  }
  const linkageWb = fluxLinkageWb(duty);
  const bestLimitT = Math.max(
    ...materials.map((material) => saturationLimitT(material, duty.ambientTemperatureC, settings)),
    1e-9,
  );
  return {
    turnsStart: shapes.map((shape) =>
      Math.max(1, Math.floor((0.9 * linkageWb) / (bestLimitT * coreGeometry(shape).minimumAreaM2))),
    ),
    turnsCount: request.space.primaryTurnsCount,
  };
}
