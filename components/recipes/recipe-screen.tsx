import { Link } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { amountUnitLabels, substrateLabels } from '../../shared/terms/recipe';
import { bannerMessage } from '../api/error-messages';
import { useBatchPlanQuery, useRecipeQuery } from '../api/recipes';
import { PlanView } from '../batches/plan-view';
import { Loading } from '../lab-gate';
import { useLab } from '../lab-context';
import { colors, radius, space } from '../theme';
import { Banner } from '../ui/banner';
import { Card } from '../ui/card';
import { AppText } from '../ui/text';
import { formatDuration, formatTemperature, round, useUnitSystem } from '../units';

function LinkButton({
  href,
  label,
  testID,
  primary,
}: {
  href: string;
  label: string;
  testID: string;
  primary?: boolean;
}) {
  return (
    <Link
      href={href as never}
      testID={testID}
      style={[styles.link, primary ? styles.primary : styles.secondary]}
    >
      <AppText variant="label" style={{ color: primary ? colors.onPrimary : colors.primary }}>
        {label}
      </AppText>
    </Link>
  );
}

export function RecipeScreen({ recipeId }: { recipeId: string }) {
  const { lab, can } = useLab();
  const units = useUnitSystem();
  const recipe = useRecipeQuery(lab.id, recipeId);
  const r = recipe.data?.current;
  const preview = useBatchPlanQuery(
    lab.id,
    r
      ? {
          recipeRevisionId: r.id,
          storageTempC: 20,
          target: { basis: 'water_volume', millilitres: units === 'us' ? 3785.411784 : 1000 },
        }
      : undefined,
  );
  if (recipe.isPending) return <Loading />;
  if (recipe.error || !recipe.data || !r) {
    return <Banner tone="error" message={bannerMessage(recipe.error)} />;
  }
  const base = `/labs/${lab.id}/recipes/${recipe.data.id}`;
  return (
    <View style={styles.screen}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        {recipe.data.name}
      </AppText>
      <AppText tone="muted">
        {substrateLabels[recipe.data.substrate]} · revision {r.number} of{' '}
        {recipe.data.revisionCount}
        {r.batchCount
          ? ` · used by ${r.batchCount} batch${r.batchCount === 1 ? '' : 'es'} (frozen)`
          : ' · not used yet'}
      </AppText>
      <View style={styles.actions}>
        {can('edit') ? (
          <LinkButton
            href={`/labs/${lab.id}/batches/new?recipeId=${recipe.data.id}`}
            label="Prepare a batch"
            testID="prepare-batch"
            primary
          />
        ) : null}
        {can('edit') ? (
          <LinkButton href={`${base}/edit`} label="Edit" testID="edit-recipe" />
        ) : null}
        <LinkButton href={`${base}/history`} label="History" testID="recipe-history" />
      </View>
      <Card title="What to dissolve">
        {r.ingredients.map((i) => (
          <AppText key={i.chemicalId}>
            {i.chemicalName}: {round(i.amount, 4)} {amountUnitLabels[i.unit]}
            {i.unit !== 'g_per_100g_water'
              ? ` (${round(i.gPer100gWater, 2)} g per 100 g water)`
              : ''}
          </AppText>
        ))}
        <AppText>Mix in water at {formatTemperature(r.mixingTempC, units)}.</AppText>
      </Card>
      <Card title="Soak, drain, dry">
        <AppText>
          Soak {formatDuration(r.soakMinutes)} · drain {formatDuration(r.drainMinutes)} · dry{' '}
          {r.dryingMethod}
          {r.dryingMinutes !== null ? ` for ${formatDuration(r.dryingMinutes)}` : ''}
          {r.dryingTempC !== null ? ` at ${formatTemperature(r.dryingTempC, units)}` : ''}
          {r.dryingRhPct !== null ? `, ${round(r.dryingRhPct, 0)} % RH` : ''}
        </AppText>
        {r.conditioning ? <AppText>Conditioning: {r.conditioning}</AppText> : null}
        {r.notes ? <AppText tone="muted">{r.notes}</AppText> : null}
      </Card>
      <Card
        title={units === 'us' ? 'For 1 US gallon of water' : 'For 1 litre of water'}
        testID="recipe-preview"
      >
        {preview.data ? <PlanView plan={preview.data} units={units} /> : null}
        {preview.error ? <Banner tone="error" message={bannerMessage(preview.error)} /> : null}
      </Card>
    </View>
  );
}

const styles = StyleSheet.create({
  screen: { gap: space.lg },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  link: {
    paddingHorizontal: space.lg,
    paddingVertical: space.md,
    borderRadius: radius.sm,
    borderWidth: 2,
  },
  primary: { backgroundColor: colors.primary, borderColor: colors.primary },
  secondary: { backgroundColor: colors.surface, borderColor: colors.primary },
});
