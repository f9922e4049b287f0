import { Hono } from 'hono';
import { MATERIAL_CLASSES } from '../../solvers/index.js';
import { tenantOf } from '../auth/caller.js';
import { CATALOG_NOTES } from '../catalog/catalog-notes.js';
import { builtInMaterialView, userMaterialView } from '../catalog/material-view.js';
import { userMaterialContent } from '../catalog/user-material-content.js';
import { infeasibleProblem } from '../errors/infeasible-problem.js';
import { ProblemError } from '../errors/problem-error.js';
import { PROBLEM_TYPES } from '../errors/problem-types.js';
import { readJsonBody } from '../http/read-json-body.js';
import { sendJson } from '../http/send-json.js';
import { MaterialRequestSchema } from '../schemas/material-request-schema.js';
import { materialNameKey, type MaterialStore } from '../stores/material-store.js';

const BUILT_IN = MATERIAL_CLASSES.map(builtInMaterialView);
const BUILT_IN_KEYS = new Set(BUILT_IN.map((material) => materialNameKey(material.name)));

const NOT_FITTABLE = { problemType: PROBLEM_TYPES.lossPointsNotFittable };

const nameTaken = (name: string) =>
  new ProblemError(PROBLEM_TYPES.materialNameTaken, {
    detail: `a material named '${name}' exists already (names are unique ignoring case)`,
  });

/** /v1/catalog/materials: the built-in generic classes, plus user materials fitted from loss points. */
export function materialRoutes({ materials }: { materials: MaterialStore }): Hono {
  const routes = new Hono();

  routes.get('/', async (c) => {
    const users = (await materials.list(tenantOf(c))).map(userMaterialView);
    return sendJson(c, 200, { note: CATALOG_NOTES.materials, items: [...BUILT_IN, ...users] });
  });

  routes.post('/', async (c) => {
    const request = await readJsonBody(c, MaterialRequestSchema);
    if (BUILT_IN_KEYS.has(materialNameKey(request.name))) throw nameTaken(request.name);
    const content = userMaterialContent(request);
    if (!content.ok) throw infeasibleProblem(content.issues, NOT_FITTABLE);
    const record = await materials.create(tenantOf(c), content.value);
    if (record === 'name-taken') throw nameTaken(request.name);
    const view = userMaterialView(record);
    return sendJson(c, 201, view, { location: view.links.self });
  });

  routes.get('/:id', async (c) => {
    const id = c.req.param('id');
    const builtIn = BUILT_IN.find((material) => material.id === id);
    if (builtIn) return sendJson(c, 200, builtIn);
    const record = await materials.get(tenantOf(c), id);
    if (!record) throw new ProblemError(PROBLEM_TYPES.notFound, { detail: `no material ${id}` });
    return sendJson(c, 200, userMaterialView(record));
  });

  return routes;
}
