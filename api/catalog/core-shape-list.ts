import {
  CORE_SHAPE_CATALOG,
  coreGeometry,
  type CoreShape,
  type CoreGeometry,
} from '../../solvers/index.js';
import type { CoreShapeList } from '../schemas/core-shape-list-schema.js';
import { CATALOG_NOTES } from './catalog-notes.js';

/** The catalog's shapes with their geometry, computed once: the catalog never changes. */
let entries: (CoreShape & { geometry: CoreGeometry })[] | undefined;

/**
 * Returns the catalog core shapes (all, or one family) with their nominal dimensions and their
 * computed geometry (IEC 60205 effective parameters, window, mean turn length, surface), SI units.
 */
export function coreShapeList(family?: CoreShape['family']): CoreShapeList {
  entries ??= CORE_SHAPE_CATALOG.map((shape) => ({ ...shape, geometry: coreGeometry(shape) }));
  const items = family === undefined ? entries : entries.filter((entry) => entry.family === family);
  return { note: CATALOG_NOTES.coreShapes, items };
}
