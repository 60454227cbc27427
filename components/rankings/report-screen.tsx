import { useLocalSearchParams } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { bannerMessage } from '../api/error-messages';
import { useRankingQuery, type RankingFilters } from '../api/rankings';
import { Loading } from '../lab-gate';
import { useLab } from '../lab-context';
import { colors, space } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { printHide, printPage, usePrintStyle } from '../ui/print';
import { AppText } from '../ui/text';
import { formatLength, round, useUnitSystem } from '../units';
import { RankingChart } from './ranking-chart';

const p = (v: number | null) => (v === null ? '–' : v < 0.001 ? '< 0.001' : round(v, 3));

/** A printable comparison: criteria, ranking, chart and the cautions, for a lead, client or inspector. */
export function ReportScreen() {
  usePrintStyle();
  const { lab } = useLab();
  const units = useUnitSystem();
  const params = useLocalSearchParams<{
    sort?: string;
    profile?: string;
    substrate?: string;
    unreviewed?: string;
  }>();
  const filters: RankingFilters = {
    sort: params.sort === 'reduction' ? 'reduction' : 'treated_char',
    ...(params.profile ? { profile: params.profile } : {}),
    ...(params.substrate ? { substrate: params.substrate } : {}),
    ...(params.unreviewed === 'true' ? { unreviewed: true } : {}),
  };
  const ranking = useRankingQuery(lab.id, filters);
  if (ranking.isPending) return <Loading />;
  const r = ranking.data;
  if (!r) return <Banner tone="error" message={bannerMessage(ranking.error)} />;
  return (
    <View style={styles.page} testID="ranking-report">
      <View style={styles.actions} {...printHide}>
        <Button label="Print" compact onPress={printPage} testID="print-report" />
      </View>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        Treatment comparison
      </AppText>
      <AppText>
        {lab.name} · {new Date().toLocaleDateString(undefined, { dateStyle: 'long' })} ·{' '}
        {r.pairsCounted} paired burn test
        {r.pairsCounted === 1 ? '' : 's'} (
        {r.onlySignedOff ? 'signed off only' : 'including tests waiting for review'}) · ranked by{' '}
        {filters.sort === 'reduction'
          ? 'mean reduction against the controls'
          : 'mean treated char length'}
      </AppText>
      <View style={styles.box}>
        <AppText variant="label">Criteria</AppText>
        <AppText>
          {r.profile
            ? `${r.profile.name}${r.profile.source ? ` — ${r.profile.source}` : ''}. ${r.profile.caution}`
            : 'None chosen: no pass or fail is given.'}
        </AppText>
      </View>
      {r.leaderStatement ? <AppText testID="report-leader">{r.leaderStatement}</AppText> : null}
      {r.ranked.length ? <RankingChart treatments={r.ranked} /> : null}
      {[...r.ranked, ...r.notEnoughPairs].map((t) => (
        <View
          key={t.key}
          style={styles.treatment}
          testID={`report-treatment-${t.rank ?? 'unranked'}`}
        >
          <AppText variant="heading">
            {t.rank ? `${t.rank}. ` : 'Not ranked (fewer than 3 pairs): '}
            {t.recipeName}, revision {t.revisionNumber}, on {t.substrate}
          </AppText>
          <AppText>
            {t.pairs} pairs. Treated char {formatLength(t.treatedChar.mean, units)} (SD{' '}
            {formatLength(t.treatedChar.sd, units)}), control{' '}
            {formatLength(t.controlChar.mean, units)}. Shorter by{' '}
            {formatLength(t.difference.mean, units)}
            {t.difference.ci95
              ? ` (95 % CI ${formatLength(t.difference.ci95[0], units)} to ${formatLength(t.difference.ci95[1], units)})`
              : ''}
            {t.difference.reductionPct !== null ? `, ${round(t.difference.reductionPct, 0)} %` : ''}
            ; paired t p {p(t.difference.pairedP)}, signed-rank p {p(t.difference.wilcoxonP)}.
          </AppText>
          <AppText>
            Went out by itself in {t.selfExtinguish.count} of {t.pairs}; afterflame median{' '}
            {t.afterflameMedianS === null ? '–' : `${round(t.afterflameMedianS, 1)} s`}, afterglow
            median {t.afterglowMedianS === null ? '–' : `${round(t.afterglowMedianS, 1)} s`}
            {t.addOnMeanPct !== null ? `; add-on ${round(t.addOnMeanPct, 1)} %` : ''}.
          </AppText>
          {t.verdict ? (
            <AppText variant="label" tone={t.verdict.pass ? 'ok' : 'danger'}>
              {t.verdict.pass
                ? 'Meets the criteria.'
                : `Does not meet the criteria: ${t.verdict.notEnough ?? t.verdict.failed.join(' ')}`}
            </AppText>
          ) : null}
        </View>
      ))}
      <View style={styles.box} testID="report-cautions">
        <AppText variant="label">Please note</AppText>
        <AppText>
          These are bench burn tests of treated specimens beside untreated controls. They are not a
          certification and do not replace a standard laboratory test. Local fire codes and the
          Authority Having Jurisdiction decide whether a treated material is accepted. Treatments
          wear off with washing, weathering and time.
        </AppText>
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  page: { gap: space.lg, backgroundColor: colors.surface, padding: space.lg },
  actions: { flexDirection: 'row', justifyContent: 'flex-end' },
  box: { borderWidth: 2, borderColor: colors.ink, padding: space.md, gap: space.xs },
  treatment: {
    gap: space.xs,
    paddingBottom: space.md,
    borderBottomWidth: 1,
    borderBottomColor: colors.line,
  },
});
