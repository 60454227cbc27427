import { StyleSheet, View } from 'react-native';
import type { BatchPlanOutput } from '../../shared/schemas/batch';
import { type UnitSystem } from '../../shared/terms/roles';
import { colors, space } from '../theme';
import { Banner } from '../ui/banner';
import { AppText } from '../ui/text';
import { formatMass, formatTemperature, formatWeighMass, round } from '../units';

type Threshold = BatchPlanOutput['ingredients'][number]['crystallisesBelow'];

function crystalText(t: Threshold, units: UnitSystem): string {
  switch (t.kind) {
    case 'below':
      return `crystals below ${formatTemperature(t.tempC, units)}`;
    case 'dissolved_down_to':
      return `stays dissolved down to ${formatTemperature(t.tempC, units)} (lowest data point)`;
    case 'never_dissolves_up_to':
      return `does not dissolve even at ${formatTemperature(t.tempC, units)}`;
    default:
      return 'no solubility data';
  }
}

const statusWords = {
  ok: 'dissolves',
  near: 'near saturation',
  supersaturated: 'too much to stay dissolved',
  outside_data_range: 'outside the data range',
  no_data: 'no data',
} as const;

/** What to weigh and whether it stays dissolved, as the calculator worked it out. */
export function PlanView({
  plan,
  units,
  compact,
}: {
  plan: BatchPlanOutput;
  units: UnitSystem;
  compact?: boolean;
}) {
  const serious = plan.warnings.filter((w) => w.code.startsWith('supersaturated'));
  const other = plan.warnings.filter((w) => !w.code.startsWith('supersaturated'));
  return (
    <View style={styles.wrap} testID="plan">
      {serious.map((w, i) => (
        <Banner key={`s${i}`} tone="error" message={w.message} testID="plan-warning-serious" />
      ))}
      <View style={styles.table}>
        {plan.ingredients.map((i) => (
          <View key={i.key} style={styles.row} testID={`plan-${i.key}`}>
            <View style={styles.name}>
              <AppText variant="label">{i.name}</AppText>
              <AppText variant="small" tone="muted">
                {round(i.gPer100gWater, 2)} g per 100 g water · at storage:{' '}
                {statusWords[i.saturation.storage.status]}
                {i.saturation.storage.ratio !== undefined
                  ? ` (${round(i.saturation.storage.ratio * 100, 0)} % of saturation)`
                  : ''}{' '}
                · {crystalText(i.crystallisesBelow, units)}
              </AppText>
            </View>
            <AppText variant="heading" testID={`plan-mass-${i.key}`}>
              {formatWeighMass(i.massG, units)}
            </AppText>
          </View>
        ))}
        <View style={styles.row}>
          <AppText variant="label" style={styles.name}>
            Water
          </AppText>
          <AppText variant="heading">{formatWeighMass(plan.waterMassG, units)}</AppText>
        </View>
      </View>
      <AppText tone="muted" variant="small" testID="plan-totals">
        Solution {formatMass(plan.solutionMassG, units)} · solids{' '}
        {round(plan.totalSolidsPercent, 2)} % · boron {round(plan.boronPercent, 3)} % · as boric
        acid {formatMass(plan.boricAcidEquivalentG, units)} · as B₂O₃{' '}
        {formatMass(plan.b2o3EquivalentG, units)}
      </AppText>
      {plan.combinedBorate ? (
        <AppText variant="small" tone="muted">
          Borax with boric acid: {round(plan.combinedBorate.solidsGPer100gWater, 1)} of at most{' '}
          {round(plan.combinedBorate.limitGPer100gWater, 1)} g per 100 g water.{' '}
          {plan.combinedBorate.note}
        </AppText>
      ) : null}
      {compact
        ? null
        : other.map((w, i) => (
            <Banner key={`o${i}`} tone="caution" message={w.message} testID="plan-warning" />
          ))}
      {compact ? null : (
        <AppText variant="small" tone="muted">
          Assumptions: {plan.assumptions.join(' ')}
        </AppText>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.md },
  table: { gap: space.xs },
  row: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    paddingVertical: space.sm,
    borderBottomWidth: 1,
    borderBottomColor: colors.line,
  },
  name: { flex: 1, gap: 2 },
});
