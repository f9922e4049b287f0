import type { CoreShape } from './core-shape.js';
import { eFamilySections } from './e-family-sections.js';
import {
  iec60205EffectiveParameters,
  type EffectiveParameters,
} from './iec-60205-effective-parameters.js';
import { pqEffectiveParameters } from './pq-effective-parameters.js';
import { ringEffectiveParameters } from './ring-effective-parameters.js';

/** Effective parameters plus the winding window and cooling surface of a core set, SI units. */
export interface CoreGeometry extends EffectiveParameters {
  /** Area of one winding window (the winding's cross-section passes through it), m². */
  windowAreaM2: number;
  /** Length of the window along the leg a layer can fill (ring: bore circumference), m. */
  windowBreadthM: number;
  /** Width of the window across the layers (ring: bore radius), m. */
  windowWidthM: number;
  /** Length of a turn at half the window width (ring: a turn hugging the section), m. */
  meanTurnLengthM: number;
  /** Outside surface of the core with a full winding, for cooling relations, m². */
  surfaceAreaM2: number;
}

/**
 * Returns the IEC 60205 effective parameters, window, mean turn length and cooling surface of a
 * core set from its nominal dimensions. Window and surface are plain geometry without a bobbin.
 * @throws RangeError for inconsistent dimensions.
 */
export function coreGeometry(shape: CoreShape): CoreGeometry {
  const known = GEOMETRIES.get(shape);
  if (known !== undefined) return known;
  const geometry = computeGeometry(shape);
  GEOMETRIES.set(shape, geometry);
  return geometry;
}

/**
 * Geometry already computed, by shape object: searches ask for the same catalog shape many
 * times. Shapes are plain data that nothing mutates, so the memo cannot go stale.
 */
const GEOMETRIES = new WeakMap<CoreShape, CoreGeometry>();

function computeGeometry(shape: CoreShape): CoreGeometry {
  if (shape.family === 'ring') {
    const r1 = shape.innerDiameterM / 2;
    const r2 = shape.outerDiameterM / 2;
    const h = shape.heightM;
    return {
      ...ringEffectiveParameters(shape),
      windowAreaM2: Math.PI * r1 * r1,
      windowBreadthM: 2 * Math.PI * r1,
      windowWidthM: r1,
      // A thin winding round the rectangular section; thick windings are longer.
      meanTurnLengthM: 2 * (h + (r2 - r1)),
      // The wound ring as a cylinder of the core's outer diameter and height, bore filled.
      surfaceAreaM2: 2 * Math.PI * r2 * h + 2 * Math.PI * r2 * r2,
    };
  }
  const effective =
    shape.family === 'pq'
      ? pqEffectiveParameters(shape)
      : iec60205EffectiveParameters(eFamilySections(shape));
  const isRound = 'centreLegDiameterM' in shape;
  const centreM = isRound ? shape.centreLegDiameterM : shape.centreLegWidthM;
  const windowWidthM = (shape.windowSpanM - centreM) / 2;
  const windowBreadthM = 2 * shape.halfWindowHeightM;
  const legDepthM =
    'centreLegDiameterM' in shape
      ? shape.centreLegDiameterM
      : shape.family === 'efd'
        ? shape.centreLegDepthM
        : shape.depthM;
  // A turn at half the window width: round leg (ETD, EQ, PQ), a circle of diameter F + w (the
  // window width w = (E − F)/2 is the radial depth of the winding space); rectangular leg,
  // the leg's perimeter plus a circle of diameter w for the four rounded corners.
  const meanTurnLengthM = isRound
    ? Math.PI * (centreM + windowWidthM)
    : 2 * (centreM + legDepthM) + Math.PI * windowWidthM;
  // Bounding box of the pair; the winding sticks out past the depth on both sides (a PQ's
  // winding space E is wider than its depth C: it shows in the wire exits).
  const width = shape.overallWidthM;
  const height = 2 * shape.halfHeightM;
  const depth = Math.max(shape.depthM, legDepthM + 2 * windowWidthM);
  return {
    ...effective,
    windowAreaM2: windowWidthM * windowBreadthM,
    windowBreadthM,
    windowWidthM,
    meanTurnLengthM,
    surfaceAreaM2: 2 * (width * height + width * depth + height * depth),
  };
}
