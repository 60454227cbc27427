import { router } from 'expo-router';
import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { BatchTargetInput } from '../../shared/schemas/batch';
import {
  fToC,
  GRAMS_PER_OZ,
  toGrams,
  toMillilitres,
  type MassUnit,
  type VolumeUnit,
} from '../../shared/units';
import { ApiError } from '../api/client';
import { useCreateBatchMutation } from '../api/batches';
import { bannerMessage } from '../api/error-messages';
import { useLabQuery } from '../api/labs';
import { useBatchPlanQuery, useChemicalsQuery, useRecipesQuery } from '../api/recipes';
import { newClientId } from '../client-id';
import { useLab } from '../lab-context';
import { space } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { Choice } from '../ui/choice';
import { TextField } from '../ui/text-field';
import { AppText } from '../ui/text';
import { gramsFromText, parseNumber, round, useUnitSystem } from '../units';
import { Cautions } from './cautions';
import { PlanView } from './plan-view';

type Basis = BatchTargetInput['basis'];
const basisLabels: Record<Basis, string> = {
  water_volume: 'Volume of water',
  water_mass: 'Mass of water',
  solution_mass: 'Mass of solution',
};

export function NewBatchScreen({ recipeId: initialRecipe }: { recipeId?: string }) {
  const { lab, can } = useLab();
  const units = useUnitSystem();
  const recipes = useRecipesQuery(lab.id, '', '');
  const chemicals = useChemicalsQuery(lab.id);
  const labInfo = useLabQuery(lab.id);
  const create = useCreateBatchMutation(lab.id);
  const [clientId] = useState(newClientId);
  const [recipeId, setRecipeId] = useState(initialRecipe ?? '');
  const [basis, setBasis] = useState<Basis>('water_volume');
  const volumeUnits: VolumeUnit[] = units === 'us' ? ['gal', 'qt', 'L'] : ['L', 'mL'];
  const massUnits: MassUnit[] = units === 'us' ? ['lb', 'oz', 'kg'] : ['kg', 'g'];
  const [volumeUnit, setVolumeUnit] = useState<VolumeUnit>(volumeUnits[0]!);
  const [massUnit, setMassUnit] = useState<MassUnit>(massUnits[0]!);
  const [size, setSize] = useState('');
  const [storage, setStorage] = useState(units === 'us' ? '68' : '20');
  const [waterTemp, setWaterTemp] = useState('');
  const [ph, setPh] = useState('');
  const [density, setDensity] = useState('');
  const [weighed, setWeighed] = useState<Record<string, string>>({});
  const [lots, setLots] = useState<Record<string, string>>({});
  const [acknowledged, setAcknowledged] = useState(false);
  const [banner, setBanner] = useState<string>();
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});

  const recipe = recipes.data?.recipes.find((r) => r.id === recipeId);
  const celsius = (t: string) => {
    const n = parseNumber(t);
    return n === undefined || Number.isNaN(n) ? undefined : units === 'us' ? fToC(n) : n;
  };
  const target = useMemo<BatchTargetInput | undefined>(() => {
    const n = parseNumber(size);
    if (!n || n <= 0) return undefined;
    return basis === 'water_volume'
      ? { basis, millilitres: toMillilitres(n, volumeUnit) }
      : { basis, grams: toGrams(n, massUnit) };
  }, [size, basis, volumeUnit, massUnit]);
  const storageC = celsius(storage);
  const plan = useBatchPlanQuery(
    lab.id,
    recipe && target && storageC !== undefined
      ? { recipeRevisionId: recipe.current.id, target, storageTempC: storageC }
      : undefined,
  );
  const tolerance = labInfo.data?.weighTolerancePct ?? 2;
  const weighUnit = units === 'us' ? 'oz' : 'g';
  const toG = (text: string) => gramsFromText(text, units);
  const used = (chemicals.data?.chemicals ?? []).filter((c) =>
    recipe?.current.ingredients.some((i) => i.chemicalId === c.id),
  );

  if (!can('edit'))
    return <Banner tone="info" message="Only technicians and managers prepare batches." />;

  const confirm = async () => {
    setBanner(undefined);
    setFieldErrors({});
    if (!recipe || !target || !plan.data)
      return setBanner('Choose a recipe and a batch size first.');
    try {
      const batch = await create.mutateAsync({
        clientId,
        recipeRevisionId: recipe.current.id,
        target,
        storageTempC: storageC ?? 20,
        ...(celsius(waterTemp) !== undefined ? { waterTempC: celsius(waterTemp)! } : {}),
        ...(parseNumber(ph) !== undefined ? { ph: parseNumber(ph)! } : {}),
        ...(parseNumber(density) !== undefined ? { densityGMl: parseNumber(density)! } : {}),
        weighIns: plan.data.ingredients.map((i) => ({
          chemicalId: i.key,
          weighedG: toG(weighed[i.key] ?? '') ?? 0,
          ...(lots[i.key]?.trim() ? { lot: lots[i.key]!.trim() } : {}),
        })),
        cautionsAcknowledged: acknowledged as true,
      });
      router.replace(`/labs/${lab.id}/batches/${batch.id}` as never);
    } catch (err) {
      if (err instanceof ApiError)
        setFieldErrors(Object.fromEntries(err.fields.map((f) => [f.path, f.message])));
      setBanner(bannerMessage(err));
    }
  };

  return (
    <View style={styles.screen}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        Prepare a batch
      </AppText>
      {banner ? <Banner tone="error" message={banner} testID="form-banner" /> : null}
      <Card title="Recipe">
        <Choice
          label="Recipe"
          options={(recipes.data?.recipes ?? []).map((r) => ({
            value: r.id,
            label: `${r.name} (rev. ${r.current.number})`,
          }))}
          value={recipeId}
          onChange={setRecipeId}
          testID="batch-recipe"
        />
        {recipes.isSuccess && !recipes.data.recipes.length ? (
          <AppText tone="muted">Write a recipe first.</AppText>
        ) : null}
      </Card>
      <Card title="Batch size">
        <Choice
          label="Size given as"
          options={(Object.keys(basisLabels) as Basis[]).map((b) => ({
            value: b,
            label: basisLabels[b],
          }))}
          value={basis}
          onChange={setBasis}
          testID="batch-basis"
        />
        <TextField
          label="Amount"
          value={size}
          onChangeText={setSize}
          inputMode="decimal"
          testID="batch-size"
          error={fieldErrors.target}
        />
        {basis === 'water_volume' ? (
          <Choice
            label="Volume unit"
            options={volumeUnits.map((u) => ({
              value: u,
              label: u === 'gal' ? 'US gal' : u === 'qt' ? 'US qt' : u,
            }))}
            value={volumeUnit}
            onChange={setVolumeUnit}
            testID="batch-volume-unit"
          />
        ) : (
          <Choice
            label="Mass unit"
            options={massUnits.map((u) => ({ value: u, label: u }))}
            value={massUnit}
            onChange={setMassUnit}
            testID="batch-mass-unit"
          />
        )}
        <TextField
          label={`Storage temperature (${units === 'us' ? '°F' : '°C'})`}
          hint="The coldest the solution will stand at until used."
          value={storage}
          onChangeText={setStorage}
          inputMode="decimal"
          testID="batch-storage"
          error={fieldErrors.storageTempC}
        />
        <TextField
          label={`Water temperature when mixing (${units === 'us' ? '°F' : '°C'}, optional)`}
          value={waterTemp}
          onChangeText={setWaterTemp}
          inputMode="decimal"
          testID="batch-water-temp"
          error={fieldErrors.waterTempC}
        />
      </Card>
      {plan.error ? <Banner tone="error" message={bannerMessage(plan.error)} /> : null}
      {plan.data && recipe && target ? (
        <>
          <Card title="What to weigh" testID="batch-plan">
            <PlanView plan={plan.data} units={units} />
          </Card>
          <Card title="Weigh in" testID="weigh-in">
            <AppText tone="muted">
              Record what the scale shows. More than ±{round(tolerance, 2)} % from the target is
              flagged.
            </AppText>
            {plan.data.ingredients.map((i, index) => {
              const g = toG(weighed[i.key] ?? '');
              const deviation = g === undefined ? undefined : ((g - i.massG) / i.massG) * 100;
              const flagged = deviation !== undefined && Math.abs(deviation) > tolerance;
              return (
                <View key={i.key} style={styles.weigh} testID={`weigh-${index}`}>
                  <AppText variant="label">
                    {i.name}: target{' '}
                    {round(
                      units === 'us' ? i.massG / GRAMS_PER_OZ : i.massG,
                      units === 'us' ? 2 : 1,
                    )}{' '}
                    {weighUnit}
                  </AppText>
                  <TextField
                    label={`Weighed (${weighUnit})`}
                    value={weighed[i.key] ?? ''}
                    onChangeText={(t) => setWeighed((w) => ({ ...w, [i.key]: t }))}
                    inputMode="decimal"
                    testID={`weighed-${index}`}
                    error={fieldErrors[`weighIns.${index}.weighedG`]}
                  />
                  {deviation !== undefined ? (
                    <Banner
                      tone={flagged ? 'error' : 'success'}
                      testID={`deviation-${index}`}
                      message={`${deviation >= 0 ? '+' : ''}${round(deviation, 2)} % from target${flagged ? ` — outside ±${round(tolerance, 2)} %: add or remove some, or note why` : ' — within tolerance'}`}
                    />
                  ) : null}
                  <TextField
                    label="Lot number (optional)"
                    value={lots[i.key] ?? ''}
                    onChangeText={(t) => setLots((l) => ({ ...l, [i.key]: t }))}
                    testID={`lot-${index}`}
                  />
                </View>
              );
            })}
          </Card>
          <Card title="Measured (optional)">
            <TextField
              label="pH of the solution"
              value={ph}
              onChangeText={setPh}
              inputMode="decimal"
              testID="batch-ph"
              error={fieldErrors.ph}
            />
            <TextField
              label="Density (g/mL)"
              value={density}
              onChangeText={setDensity}
              inputMode="decimal"
              testID="batch-density"
              error={fieldErrors.densityGMl}
            />
          </Card>
          <Cautions
            chemicals={used}
            acknowledged={acknowledged}
            onToggle={() => setAcknowledged((a) => !a)}
          />
          {fieldErrors.cautionsAcknowledged ? (
            <Banner tone="error" message={fieldErrors.cautionsAcknowledged} />
          ) : null}
          <Button
            label="Confirm the batch"
            onPress={() => void confirm()}
            disabled={!acknowledged}
            busy={create.isPending}
            testID="confirm-batch"
          />
        </>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  screen: { gap: space.lg },
  weigh: { gap: space.sm, paddingBottom: space.md },
});
