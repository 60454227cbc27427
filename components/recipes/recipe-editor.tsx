import { router } from 'expo-router';
import { useEffect, useMemo, useState } from 'react';
import { Controller, useFieldArray, useForm, type Path } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { BatchPlanRequest } from '../../shared/schemas/batch';
import {
  amountUnitLabels,
  amountUnits,
  dryingMethods,
  substrateLabels,
  substrates,
} from '../../shared/terms/recipe';
import type { Recipe } from '../../shared/schemas/recipe';
import { useBatchPlanQuery, useChemicalsQuery, useSaveRecipeMutation } from '../api/recipes';
import { bannerMessage } from '../api/error-messages';
import { useSchemaKit } from '../schemas';
import { ApiError, schemaKit } from '../api/client';
import { PlanView } from '../batches/plan-view';
import { useLab } from '../lab-context';
import { space } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { Choice } from '../ui/choice';
import { TextField } from '../ui/text-field';
import { AppText } from '../ui/text';
import { useUnitSystem } from '../units';
import {
  emptyRecipeForm,
  formFromRevision,
  formPath,
  toRecipeInput,
  type RecipeFormValues,
} from './recipe-form';

const dryingLabels: Record<(typeof dryingMethods)[number], string> = {
  air: 'Air, hanging',
  rack: 'Flat on a rack',
  oven: 'Oven',
  press: 'Pressed',
  other: 'Other',
};

function useDebounced<T>(value: T, ms: number): T {
  const [current, setCurrent] = useState(value);
  useEffect(() => {
    const timer = setTimeout(() => setCurrent(value), ms);
    return () => clearTimeout(timer);
  }, [value, ms]);
  return current;
}

/** Write or edit a recipe, with the calculator showing 1 L (or 1 US gal) of it as you type. */
export function RecipeEditor({ recipe }: { recipe?: Recipe }) {
  const { lab } = useLab();
  const units = useUnitSystem();
  const chemicals = useChemicalsQuery(lab.id);
  const save = useSaveRecipeMutation(lab.id, recipe?.id);
  const [banner, setBanner] = useState<string>();
  const form = useForm<RecipeFormValues>({
    defaultValues: recipe
      ? formFromRevision(recipe.name, recipe.substrate, recipe.current, units)
      : emptyRecipeForm(units),
  });
  const ingredients = useFieldArray({ control: form.control, name: 'ingredients' });
  const values = useDebounced(JSON.stringify(form.watch()), 400);
  const kit = useSchemaKit();

  const previewRequest = useMemo<BatchPlanRequest | undefined>(() => {
    if (!kit) return undefined;
    const parsed = toRecipeInput(
      JSON.parse(values) as RecipeFormValues,
      units,
      kit.recipeInputSchema,
    );
    if (!parsed.ok) return undefined;
    const { ingredients: list, waterParts, mixingTempC } = parsed.input;
    return {
      ingredients: list,
      ...(waterParts !== undefined ? { waterParts } : {}),
      mixingTempC,
      storageTempC: 20,
      target: { basis: 'water_volume', millilitres: units === 'us' ? 3785.411784 : 1000 },
    };
  }, [values, units, kit]);
  const preview = useBatchPlanQuery(lab.id, previewRequest);

  const chemicalOptions = (chemicals.data?.chemicals ?? []).map((c) => ({
    value: c.id,
    label: c.name,
  }));
  const usesParts = form.watch('ingredients').some((i) => i.unit === 'parts');
  const tempUnit = units === 'us' ? '°F' : '°C';
  const frozen = recipe && recipe.current.batchCount > 0;

  const submit = form.handleSubmit(async (v) => {
    setBanner(undefined);
    let schema;
    try {
      schema = (await schemaKit()).recipeInputSchema;
    } catch (err) {
      setBanner(bannerMessage(err));
      return;
    }
    const parsed = toRecipeInput(v, units, schema);
    if (!parsed.ok) {
      for (const e of parsed.errors)
        form.setError(e.path as Path<RecipeFormValues>, { message: e.message });
      setBanner('Please check the fields marked below.');
      return;
    }
    try {
      const saved = await save.mutateAsync(parsed.input);
      router.replace(`/labs/${lab.id}/recipes/${saved.id}` as never);
    } catch (err) {
      if (err instanceof ApiError) {
        for (const f of err.fields)
          form.setError(formPath(f.path) as Path<RecipeFormValues>, { message: f.message });
      }
      setBanner(bannerMessage(err));
    }
  });

  const field = (
    name: Path<RecipeFormValues>,
    label: string,
    extra: { hint?: string; numeric?: boolean; multiline?: boolean } = {},
  ) => (
    <Controller
      control={form.control}
      name={name}
      render={({ field: f, fieldState }) => (
        <TextField
          label={label}
          hint={extra.hint}
          value={String(f.value ?? '')}
          onChangeText={f.onChange}
          onBlur={f.onBlur}
          error={fieldState.error?.message}
          inputMode={extra.numeric ? 'decimal' : undefined}
          multiline={extra.multiline}
          testID={`field-${name}`}
        />
      )}
    />
  );

  return (
    <View style={styles.screen}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        {recipe ? `Edit ${recipe.name}` : 'New recipe'}
      </AppText>
      {frozen ? (
        <Banner
          tone="info"
          message={`Revision ${recipe.current.number} is used by a batch, so it stays as it is: saving makes revision ${recipe.current.number + 1}.`}
        />
      ) : null}
      {banner ? <Banner tone="error" message={banner} testID="form-banner" /> : null}
      <Card title="Recipe">
        {field('name', 'Name')}
        <AppText variant="label">Intended substrate</AppText>
        <Controller
          control={form.control}
          name="substrate"
          render={({ field: f }) => (
            <Choice
              label="Intended substrate"
              options={substrates.map((s) => ({ value: s, label: substrateLabels[s] }))}
              value={f.value}
              onChange={f.onChange}
              testID="substrate"
            />
          )}
        />
      </Card>
      <Card title="What to dissolve">
        {ingredients.fields.map((item, index) => (
          <View key={item.id} style={styles.ingredient} testID={`ingredient-${index}`}>
            <AppText variant="label">Chemical {index + 1}</AppText>
            <Controller
              control={form.control}
              name={`ingredients.${index}.chemicalId`}
              render={({ field: f, fieldState }) => (
                <View style={{ gap: 4 }}>
                  <Choice
                    label={`Chemical ${index + 1}`}
                    options={chemicalOptions}
                    value={f.value}
                    onChange={f.onChange}
                    testID={`ingredient-${index}-chemical`}
                  />
                  {fieldState.error ? (
                    <AppText variant="small" tone="danger" role="alert">
                      {fieldState.error.message}
                    </AppText>
                  ) : null}
                </View>
              )}
            />
            {field(`ingredients.${index}.amount`, 'Amount', { numeric: true })}
            <Controller
              control={form.control}
              name={`ingredients.${index}.unit`}
              render={({ field: f }) => (
                <Choice
                  label="Unit"
                  options={amountUnits.map((u) => ({ value: u, label: amountUnitLabels[u] }))}
                  value={f.value}
                  onChange={f.onChange}
                  testID={`ingredient-${index}-unit`}
                />
              )}
            />
            {ingredients.fields.length > 1 ? (
              <Button
                label="Remove this chemical"
                tone="secondary"
                compact
                onPress={() => ingredients.remove(index)}
              />
            ) : null}
          </View>
        ))}
        <Button
          label="Add a chemical"
          tone="secondary"
          compact
          onPress={() =>
            ingredients.append({ chemicalId: '', amount: '', unit: 'g_per_100g_water' })
          }
          testID="add-ingredient"
        />
        {usesParts
          ? field('waterParts', 'Parts of water', {
              numeric: true,
              hint: 'In the same parts as the chemicals, e.g. 100.',
            })
          : null}
        {field('mixingTemp', `Water temperature for mixing (${tempUnit})`, { numeric: true })}
      </Card>
      <Card title="Soak, drain, dry">
        {field('soakMinutes', 'Soak time (minutes)', { numeric: true })}
        {field('drainMinutes', 'Drain time (minutes)', { numeric: true })}
        <AppText variant="label">Drying</AppText>
        <Controller
          control={form.control}
          name="dryingMethod"
          render={({ field: f }) => (
            <Choice
              label="Drying"
              options={dryingMethods.map((d) => ({ value: d, label: dryingLabels[d] }))}
              value={f.value}
              onChange={f.onChange}
              testID="drying-method"
            />
          )}
        />
        {field('dryingHours', 'Drying time (hours)', { numeric: true })}
        {field('dryingTemp', `Drying temperature (${tempUnit}, optional)`, { numeric: true })}
        {field('dryingRhPct', 'Drying humidity (% RH, optional)', { numeric: true })}
        {field('conditioning', 'Conditioning before testing', {
          hint: 'For example 24 h at 23 °C and 50 % RH.',
        })}
        {field('notes', 'Notes', { multiline: true })}
      </Card>
      <Card
        title={units === 'us' ? 'Calculator: 1 US gallon of water' : 'Calculator: 1 litre of water'}
        testID="recipe-preview"
      >
        {preview.data && previewRequest ? (
          <PlanView plan={preview.data} units={units} compact />
        ) : preview.error ? (
          <Banner tone="caution" message={bannerMessage(preview.error)} />
        ) : (
          <AppText tone="muted">Choose a chemical and an amount to see what to weigh.</AppText>
        )}
        <AppText variant="small" tone="muted">
          Checked at storage 20 °C (68 °F). The batch screen checks your own storage temperature.
        </AppText>
      </Card>
      <Button
        label={recipe ? 'Save the recipe' : 'Save the new recipe'}
        onPress={() => void submit()}
        busy={save.isPending}
        testID="save-recipe"
      />
    </View>
  );
}

const styles = StyleSheet.create({
  screen: { gap: space.lg },
  ingredient: { gap: space.sm, paddingBottom: space.md },
});
