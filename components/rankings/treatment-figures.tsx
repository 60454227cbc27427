import { StyleSheet, View } from 'react-native';
import type { TreatmentStatsOutput } from '../../shared/schemas/ranking';
import { type UnitSystem } from '../../shared/terms/roles';
import { colors, space } from '../theme';
import { AppText } from '../ui/text';
import { formatLength, round } from '../units';
import { meanCi95 } from './intervals';

const pValue = (p: number | null) => (p === null ? '–' : p < 0.001 ? '< 0.001' : round(p, 3));
const maybe = (v: number | null, digits: number, unit: string) =>
  v === null ? '–' : `${round(v, digits)}${unit}`;

function Figure({ label, value, testID }: { label: string; value: string; testID: string }) {
  return (
    <View style={styles.figure} testID={testID}>
      <AppText variant="label" style={styles.label}>
        {label}
      </AppText>
      <AppText style={styles.value}>{value}</AppText>
    </View>
  );
}

/** Every figure of one treatment, each with its interval where it has one. */
export function TreatmentFigures({
  t,
  pairsListed,
  units,
}: {
  t: TreatmentStatsOutput;
  /** Pairs behind the treatment, including any without both char lengths. */
  pairsListed: number;
  units: UnitSystem;
}) {
  const len = (mm: number | null) => formatLength(mm, units);
  const ci = (c: [number, number] | null) =>
    c ? `95 % CI ${len(c[0])} to ${len(c[1])}` : '95 % CI –';
  const char = (c: TreatmentStatsOutput['treatedChar']) =>
    `mean ${len(c.mean)} (${ci(meanCi95(c.mean, c.sd, t.pairs))}) · median ${len(c.median)} · SD ${len(c.sd)}`;
  const d = t.difference;
  const pct = (v: number | null) => (v === null ? '–' : round(v * 100, 0));
  return (
    <View style={styles.list}>
      <Figure label="Treated char length" value={char(t.treatedChar)} testID="fig-treated" />
      <Figure label="Control char length" value={char(t.controlChar)} testID="fig-control" />
      <Figure
        label="Shorter than its control by (paired)"
        value={`mean ${len(d.mean)} (${ci(d.ci95)}) · SD of the differences ${len(d.sd)}`}
        testID="fig-difference"
      />
      <Figure
        label="Reduction"
        value={d.reductionPct === null ? '–' : `${round(d.reductionPct, 1)} % of the control's`}
        testID="fig-reduction"
      />
      <Figure label="Paired t-test" value={`p ${pValue(d.pairedP)}`} testID="fig-paired-t" />
      <Figure
        label="Wilcoxon signed-rank test"
        value={`p ${pValue(d.wilcoxonP)}${
          d.wilcoxonMethod
            ? d.wilcoxonMethod === 'exact'
              ? ' (exact)'
              : ' (normal approximation)'
            : ''
        }`}
        testID="fig-wilcoxon"
      />
      <Figure label="Effect size, Cohen's dz" value={maybe(d.cohenDz, 2, '')} testID="fig-dz" />
      <Figure
        label="Went out by itself"
        value={`${t.selfExtinguish.count} of ${pairsListed} (${pct(t.selfExtinguish.rate)} %, 95 % Wilson interval ${pct(t.selfExtinguish.lo)}–${pct(t.selfExtinguish.hi)} %)`}
        testID="fig-self-extinguish"
      />
      <Figure
        label="Afterflame, median (treated)"
        value={maybe(t.afterflameMedianS, 1, ' s')}
        testID="fig-afterflame"
      />
      <Figure
        label="Afterglow, median (treated)"
        value={maybe(t.afterglowMedianS, 1, ' s')}
        testID="fig-afterglow"
      />
      <Figure
        label="Mass loss, mean (treated)"
        value={maybe(t.massLossMeanPct, 1, ' %')}
        testID="fig-mass-loss"
      />
      <Figure label="Add-on, mean" value={maybe(t.addOnMeanPct, 1, ' %')} testID="fig-add-on" />
      <Figure
        label="Pairs for 80 % power at the observed difference"
        value={t.pairsNeeded === null ? '–' : `${t.pairsNeeded} (you have ${t.pairs})`}
        testID="fig-pairs-needed"
      />
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  figure: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    columnGap: space.md,
    rowGap: space.xs,
    paddingBottom: space.sm,
    borderBottomWidth: 1,
    borderBottomColor: colors.line,
  },
  label: { flexBasis: 220, flexGrow: 1 },
  value: { flexBasis: 260, flexGrow: 3 },
});
