import { Link } from 'expo-router';
import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import type { TreatmentDetailOutput } from '../../shared/schemas/treatment';
import { bannerMessage } from '../api/error-messages';
import { useTreatmentQuery, type RankingFilters } from '../api/rankings';
import { Loading } from '../lab-gate';
import { useLab } from '../lab-context';
import { colors, space } from '../theme';
import { Banner } from '../ui/banner';
import { Card } from '../ui/card';
import { AppText } from '../ui/text';
import { formatLength, useUnitSystem } from '../units';
import { DifferenceChart } from './difference-chart';
import { PairLinesChart } from './pair-lines-chart';
import { SampleSizeHelper } from './sample-size-helper';
import {
  differenceDots,
  differenceSummary,
  pairLines,
  pairLinesSummary,
} from './treatment-chart-data';
import { TreatmentFigures } from './treatment-figures';
import { TreatmentPairs } from './treatment-pairs';

function BackLink({ labId }: { labId: string }) {
  return (
    <Link href={`/labs/${labId}/rankings` as never} testID="back-to-rankings">
      <AppText variant="label" style={{ color: colors.primary }}>
        ← Rankings
      </AppText>
    </Link>
  );
}

function Verdict({ d }: { d: TreatmentDetailOutput }) {
  const v = d.treatment.verdict;
  if (!d.profile || !v) {
    return (
      <AppText tone="muted" testID="verdict-none">
        No criteria chosen: pick a criteria profile on the rankings screen to judge this treatment.
      </AppText>
    );
  }
  return (
    <View style={{ gap: space.sm }}>
      <Banner
        tone={v.pass ? 'success' : 'error'}
        testID="verdict"
        message={
          v.pass
            ? `Meets ${d.profile.name}.`
            : `Does not meet ${d.profile.name}${v.notEnough ? `: ${v.notEnough}` : '.'}`
        }
      />
      {v.failed.map((rule) => (
        <AppText key={rule} testID="failed-rule">
          • {rule}
        </AppText>
      ))}
      <AppText variant="small" tone="muted">
        {d.profile.caution}
      </AppText>
    </View>
  );
}

/** A chart with its text alternative: the summary is what a screen reader announces. */
function Figure({
  summary,
  testID,
  children,
}: {
  summary: string;
  testID: string;
  children: ReactNode;
}) {
  return (
    <View role="img" aria-label={summary} accessibilityLabel={summary} testID={testID}>
      {children}
    </View>
  );
}

/** One treatment: every figure with its interval, the verdict, two charts, the pairs. */
export function TreatmentScreen({
  treatmentKey,
  filters,
}: {
  treatmentKey: string;
  filters: RankingFilters;
}) {
  const { lab } = useLab();
  const units = useUnitSystem();
  const query = useTreatmentQuery(lab.id, treatmentKey, filters);
  if (query.isPending) return <Loading />;
  const d = query.data;
  if (!d) {
    return (
      <View style={styles.screen}>
        <BackLink labId={lab.id} />
        <Banner tone="error" message={bannerMessage(query.error)} testID="treatment-error" />
      </View>
    );
  }
  const t = d.treatment;
  const format = (mm: number) => formatLength(mm, units);
  const lines = pairLines(d.pairs);
  const dots = differenceDots(d.pairs, t.difference);
  return (
    <View style={styles.screen}>
      <BackLink labId={lab.id} />
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        {t.recipeName} (rev. {t.revisionNumber})
      </AppText>
      <AppText tone="muted" testID="treatment-subtitle">
        On {t.substrate} · {t.rank ? `rank ${t.rank}` : 'not ranked (fewer than 3 pairs)'} ·{' '}
        {d.pairs.length} pair{d.pairs.length === 1 ? '' : 's'}{' '}
        {d.onlySignedOff ? '(signed off only)' : '(including tests waiting for review)'}
      </AppText>
      <Card title="Verdict">
        <Verdict d={d} />
      </Card>
      <Card title="Figures">
        <TreatmentFigures t={t} pairsListed={d.pairs.length} units={units} />
      </Card>
      <Card title="Each pair, control to treated">
        <Figure summary={pairLinesSummary(d.pairs, format)} testID="pair-lines-figure">
          {lines.keys.length ? (
            <PairLinesChart lines={lines} />
          ) : (
            <AppText tone="muted">No pair has both char lengths yet.</AppText>
          )}
        </Figure>
      </Card>
      <Card title="Paired differences, control − treated (line: mean; band: 95 % CI; dashes: zero)">
        <Figure summary={differenceSummary(dots, format)} testID="difference-figure">
          {dots.dots.length ? (
            <>
              <DifferenceChart plot={dots} />
              <AppText variant="small" tone="muted">
                Each dot is one pair, numbered as in the list of pairs below.
              </AppText>
            </>
          ) : (
            <AppText tone="muted">No pair has both char lengths yet.</AppText>
          )}
        </Figure>
      </Card>
      <Card title="How many pairs to show a reduction">
        <SampleSizeHelper
          sdDiff={t.difference.sd}
          observedMm={t.difference.mean}
          have={t.pairs}
          units={units}
        />
      </Card>
      <Card title="Pairs">
        <TreatmentPairs labId={lab.id} pairs={d.pairs} units={units} />
      </Card>
    </View>
  );
}

const styles = StyleSheet.create({
  screen: { gap: space.lg },
});
