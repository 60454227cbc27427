import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BatchPlanRequest } from '../../shared/schemas/batch';
import type { CreateChemicalInput } from '../../shared/schemas/chemical';
import { type Substrate } from '../../shared/terms/recipe';
import type { RecipeInput } from '../../shared/schemas/recipe';
import { apiRequest } from './client';

export const recipeKeys = {
  chemicals: (labId: string) => ['labs', labId, 'chemicals'] as const,
  chemical: (labId: string, id: string) => ['labs', labId, 'chemicals', id] as const,
  recipes: (labId: string) => ['labs', labId, 'recipes'] as const,
  list: (labId: string, q: string, substrate: string) =>
    ['labs', labId, 'recipes', 'list', q, substrate] as const,
  recipe: (labId: string, id: string) => ['labs', labId, 'recipes', id] as const,
  revisions: (labId: string, id: string) => ['labs', labId, 'recipes', id, 'revisions'] as const,
  plan: (labId: string, body: unknown) =>
    ['labs', labId, 'batch-plan', JSON.stringify(body)] as const,
};

export function useChemicalsQuery(labId: string) {
  return useQuery({
    queryKey: recipeKeys.chemicals(labId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/chemicals`, (k) => k.chemicalListSchema, { signal }),
    staleTime: 5 * 60_000,
  });
}

export function useChemicalQuery(labId: string, chemicalId: string) {
  return useQuery({
    queryKey: recipeKeys.chemical(labId, chemicalId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/chemicals/${chemicalId}`, (k) => k.chemicalSchema, { signal }),
  });
}

export function useCreateChemicalMutation(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateChemicalInput) =>
      apiRequest(`/api/labs/${labId}/chemicals`, (k) => k.chemicalSchema, {
        method: 'POST',
        body: input,
      }),
    onSuccess: () => client.invalidateQueries({ queryKey: recipeKeys.chemicals(labId) }),
  });
}

export function useRecipesQuery(labId: string, q: string, substrate: Substrate | '') {
  const params = new URLSearchParams();
  if (q.trim()) params.set('q', q.trim());
  if (substrate) params.set('substrate', substrate);
  return useQuery({
    queryKey: recipeKeys.list(labId, q.trim(), substrate),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/recipes?${params}`, (k) => k.recipeListSchema, { signal }),
    placeholderData: keepPreviousData,
  });
}

export function useRecipeQuery(labId: string, recipeId: string) {
  return useQuery({
    queryKey: recipeKeys.recipe(labId, recipeId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/recipes/${recipeId}`, (k) => k.recipeSchema, { signal }),
  });
}

export function useRevisionsQuery(labId: string, recipeId: string) {
  return useQuery({
    queryKey: recipeKeys.revisions(labId, recipeId),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/recipes/${recipeId}/revisions`, (k) => k.revisionListSchema, {
        signal,
      }),
  });
}

export function useSaveRecipeMutation(labId: string, recipeId?: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: RecipeInput) =>
      recipeId
        ? apiRequest(`/api/labs/${labId}/recipes/${recipeId}`, (k) => k.recipeSchema, {
            method: 'PUT',
            body: input,
          })
        : apiRequest(`/api/labs/${labId}/recipes`, (k) => k.recipeSchema, {
            method: 'POST',
            body: input,
          }),
    onSuccess: () => client.invalidateQueries({ queryKey: recipeKeys.recipes(labId) }),
  });
}

/** The calculator's answer for a request; off while the request is incomplete. */
export function useBatchPlanQuery(labId: string, body: BatchPlanRequest | undefined) {
  return useQuery({
    queryKey: recipeKeys.plan(labId, body),
    queryFn: ({ signal }) =>
      apiRequest(`/api/labs/${labId}/batch-plans`, (k) => k.batchPlanSchema, {
        method: 'POST',
        body,
        signal,
      }),
    enabled: body !== undefined,
    placeholderData: keepPreviousData,
    retry: false,
  });
}
