import { Router } from 'express';
import {
  chemicalListSchema,
  chemicalParamsSchema,
  chemicalSchema,
  createChemicalSchema,
} from '../../shared/schemas/chemical';
import { labParamsSchema } from '../../shared/schemas/lab';
import {
  recipeInputSchema,
  recipeListSchema,
  recipeParamsSchema,
  recipeQuerySchema,
  recipeSchema,
  revisionListSchema,
} from '../../shared/schemas/recipe';
import { authOf, labOf, requireLab } from '../middleware/auth';
import { validate } from '../middleware/validate';
import type { ApiDocs } from '../openapi';
import { documentPath } from '../openapi-paths';
import { createChemical, getChemical, listChemicals } from '../services/chemicals';
import {
  createRecipe,
  getRecipe,
  listRecipes,
  listRevisions,
  updateRecipe,
} from '../services/recipes';

export function recipesRouter(): Router {
  const router = Router();

  router.get('/labs/:labId/chemicals', requireLab('read'), async (_req, res) => {
    res.json({ chemicals: await listChemicals(labOf(res).id) });
  });
  router.get(
    '/labs/:labId/chemicals/:chemicalId',
    requireLab('read'),
    validate({ params: chemicalParamsSchema }),
    async (_req, res) => {
      res.json(await getChemical(labOf(res).id, res.locals.params.chemicalId));
    },
  );
  router.post(
    '/labs/:labId/chemicals',
    requireLab('edit'),
    validate({ body: createChemicalSchema }),
    async (_req, res) => {
      res.status(201).json(await createChemical(labOf(res).id, res.locals.body));
    },
  );

  router.get(
    '/labs/:labId/recipes',
    requireLab('read'),
    validate({ query: recipeQuerySchema }),
    async (_req, res) => {
      res.json({ recipes: await listRecipes(labOf(res).id, res.locals.query) });
    },
  );
  router.post(
    '/labs/:labId/recipes',
    requireLab('edit'),
    validate({ body: recipeInputSchema }),
    async (_req, res) => {
      res.status(201).json(await createRecipe(labOf(res).id, authOf(res).user.id, res.locals.body));
    },
  );
  router.get(
    '/labs/:labId/recipes/:recipeId',
    requireLab('read'),
    validate({ params: recipeParamsSchema }),
    async (_req, res) => {
      res.json(await getRecipe(labOf(res).id, res.locals.params.recipeId));
    },
  );
  router.put(
    '/labs/:labId/recipes/:recipeId',
    requireLab('edit'),
    validate({ params: recipeParamsSchema, body: recipeInputSchema }),
    async (_req, res) => {
      res.json(
        await updateRecipe(
          labOf(res).id,
          res.locals.params.recipeId,
          authOf(res).user.id,
          res.locals.body,
        ),
      );
    },
  );
  router.get(
    '/labs/:labId/recipes/:recipeId/revisions',
    requireLab('read'),
    validate({ params: recipeParamsSchema }),
    async (_req, res) => {
      res.json({ revisions: await listRevisions(labOf(res).id, res.locals.params.recipeId) });
    },
  );
  return router;
}

export function registerRecipeDocs(docs: ApiDocs): void {
  const member = 'any member of the lab';
  const editor = 'managers and technicians';
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/chemicals',
    summary: "Reference chemicals and the lab's own",
    access: member,
    params: labParamsSchema,
    ok: { status: 200, schema: chemicalListSchema, description: 'Chemicals' },
    errors: [401, 404],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/chemicals/{chemicalId}',
    summary: 'One chemical with its hazards and solubility data',
    access: member,
    params: chemicalParamsSchema,
    ok: { status: 200, schema: chemicalSchema, description: 'The chemical' },
    errors: [401, 404],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/chemicals',
    summary: "Add a chemical of the lab's own (with or without solubility data)",
    access: editor,
    params: labParamsSchema,
    body: createChemicalSchema,
    ok: { status: 201, schema: chemicalSchema, description: 'Added' },
    errors: [400, 401, 403, 404, 409],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/recipes',
    summary: 'Recipes with their current revision (search by name, filter by substrate)',
    access: member,
    params: labParamsSchema,
    query: recipeQuerySchema,
    ok: { status: 200, schema: recipeListSchema, description: 'Recipes' },
    errors: [400, 401, 404],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/recipes',
    summary: 'Write a recipe (revision 1)',
    access: editor,
    params: labParamsSchema,
    body: recipeInputSchema,
    ok: { status: 201, schema: recipeSchema, description: 'Created' },
    errors: [400, 401, 403, 404],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/recipes/{recipeId}',
    summary: 'A recipe and its current revision',
    access: member,
    params: recipeParamsSchema,
    ok: { status: 200, schema: recipeSchema, description: 'The recipe' },
    errors: [401, 404],
  });
  documentPath(docs, {
    method: 'put',
    path: '/api/labs/{labId}/recipes/{recipeId}',
    summary: 'Edit a recipe: in place while unused, else as a new revision',
    access: editor,
    params: recipeParamsSchema,
    body: recipeInputSchema,
    ok: { status: 200, schema: recipeSchema, description: 'Saved' },
    errors: [400, 401, 403, 404],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/recipes/{recipeId}/revisions',
    summary: 'Every revision, newest first',
    access: member,
    params: recipeParamsSchema,
    ok: { status: 200, schema: revisionListSchema, description: 'Revisions' },
    errors: [401, 404],
  });
}
