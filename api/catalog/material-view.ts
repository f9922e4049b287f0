import type { MaterialClass } from '../../solvers/index.js';
import type { BuiltInMaterialView, UserMaterialView } from '../schemas/material-view-schema.js';
import type { UserMaterialRecord } from '../stores/material-store.js';
import { CATALOG_NOTES } from './catalog-notes.js';

const self = (id: string) => `/v1/catalog/materials/${encodeURIComponent(id)}`;

/** A built-in material class as the API returns it: its numbers, marked invented. */
export function builtInMaterialView(material: MaterialClass): BuiltInMaterialView {
  return {
    ...material,
    name: material.id,
    origin: 'built-in',
    note: CATALOG_NOTES.builtInMaterial,
    links: { self: self(material.id) },
  };
}

/** A stored user material as the API returns it: fitted coefficients, fit error, the points. */
export function userMaterialView(record: UserMaterialRecord): UserMaterialView {
  const { fit, id, name, ...rest } = record;
  return {
    id,
    name,
    origin: 'user',
    steinmetz: fit.coefficients,
    fit: {
      rmsLog10Error: fit.rmsLog10Error,
      worstRelativeError: fit.worstRelativeError,
      pointCount: record.lossPoints.length,
    },
    ...rest,
    links: { self: self(id) },
  };
}
