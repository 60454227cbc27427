import { Link } from 'expo-router';
import { useState } from 'react';
import { Platform, StyleSheet, useWindowDimensions, View } from 'react-native';
import type { TreatmentStatsOutput } from '../../shared/schemas/ranking';
import { igniterLabels, igniters, orientationLabels, orientations } from '../../shared/terms/burn';
import { substrateLabels, substrates } from '../../shared/terms/recipe';
import { ApiError } from '../api/client';
import { bannerMessage } from '../api/error-messages';
import {
  rankingQueryString,
  useCriteriaProfilesQuery,
  usePresetsQuery,
  useRankingQuery,
  type RankingFilters,
} from '../api/rankings';
import { useLab } from '../lab-context';
import { colors, space, WIDE_BREAKPOINT } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { Choice } from '../ui/choice';
import { TextField } from '../ui/text-field';
import { tableStyles } from '../ui/table';
import { AppText } from '../ui/text';
import { formatLength, round, useUnitSystem } from '../units';
import { RankingChart } from './ranking-chart';
import { treatmentHref } from './treatment-link';

const pValue = (p: number | null) => (p === null ? '–' : p < 0.001 ? '< 0.001' : round(p, 3));

function Interval({ ci, units }: { ci: [number, number] | null; units: 'metric' | 'us' }) {
  if (!ci) return <AppText variant="small">95 % CI –</AppText>;
  return (
    <AppText variant="small">
      95 % CI {formatLength(ci[0], units)} to {formatLength(ci[1], units)}
    </AppText>
  );
}

function TreatmentCard({
  t,
  units,
  href,
}: {
  t: TreatmentStatsOutput;
  units: 'metric' | 'us';
  href: string;
}) {
  return (
    <Card testID={`treatment-${t.rank ?? 'unranked'}`}>
      <AppText variant="heading">
        {t.rank ? `${t.rank}. ` : ''}
        {t.recipeName} (rev. {t.revisionNumber})
      </AppText>
      <AppText tone="muted">
        {t.substrate} · {t.pairs} pair{t.pairs === 1 ? '' : 's'}
      </AppText>
      <AppText testID="treated-char">
        Treated char {formatLength(t.treatedChar.mean, units)} (median{' '}
        {formatLength(t.treatedChar.median, units)}, SD {formatLength(t.treatedChar.sd, units)})
        against control {formatLength(t.controlChar.mean, units)}
      </AppText>
      <AppText>
        Shorter by {formatLength(t.difference.mean, units)}
        {t.difference.reductionPct !== null ? ` (${round(t.difference.reductionPct, 0)} %)` : ''}
      </AppText>
      <Interval ci={t.difference.ci95} units={units} />
      <AppText variant="small" tone="muted">
        Paired t p {pValue(t.difference.pairedP)} · signed-rank p {pValue(t.difference.wilcoxonP)}
        {t.difference.wilcoxonMethod ? ` (${t.difference.wilcoxonMethod})` : ''} · effect dz{' '}
        {round(t.difference.cohenDz ?? NaN, 2)}
      </AppText>
      <AppText variant="small" tone="muted">
        Went out by itself {t.selfExtinguish.count} of {t.pairs} (
        {round((t.selfExtinguish.rate ?? 0) * 100, 0)} %, 95 % CI{' '}
        {round((t.selfExtinguish.lo ?? 0) * 100, 0)}–{round((t.selfExtinguish.hi ?? 0) * 100, 0)} %)
        · afterflame median{' '}
        {t.afterflameMedianS === null ? '–' : `${round(t.afterflameMedianS, 1)} s`} · afterglow
        median {t.afterglowMedianS === null ? '–' : `${round(t.afterglowMedianS, 1)} s`}
        {t.addOnMeanPct !== null ? ` · add-on ${round(t.addOnMeanPct, 1)} %` : ''}
      </AppText>
      {t.pairsNeeded !== null ? (
        <AppText variant="small" tone="muted">
          Pairs needed to show this difference at 80 % power: {t.pairsNeeded}
        </AppText>
      ) : null}
      {t.verdict ? (
        <Banner
          tone={t.verdict.pass ? 'success' : 'error'}
          testID="verdict"
          message={
            t.verdict.pass
              ? 'Meets the chosen criteria.'
              : `Does not meet the criteria: ${t.verdict.notEnough ?? t.verdict.failed.join(' ')}`
          }
        />
      ) : null}
      <Link href={href as never} testID={`open-treatment-${t.rank ?? 'unranked'}`}>
        <AppText variant="label" style={{ color: colors.primary }}>
          Figures, charts and pairs →
        </AppText>
      </Link>
    </Card>
  );
}

function TreatmentTable({
  list,
  units,
  hrefOf,
}: {
  list: TreatmentStatsOutput[];
  units: 'metric' | 'us';
  hrefOf: (t: TreatmentStatsOutput) => string;
}) {
  const head = [
    '#',
    'Treatment',
    'Pairs',
    'Treated char',
    'Control char',
    'Shorter by (95 % CI)',
    'p (t / rank)',
    'Out by itself',
    'Pairs for 80 % power',
    'Verdict',
  ];
  return (
    <View role="table" aria-label="Ranking" style={styles.table}>
      <View role="row" style={[tableStyles.row, tableStyles.head]}>
        {head.map((h, i) => (
          <AppText
            key={h}
            variant="label"
            role="columnheader"
            style={[tableStyles.cell, i === 1 && styles.wide]}
          >
            {h}
          </AppText>
        ))}
      </View>
      {list.map((t) => (
        <View key={t.key} role="row" style={tableStyles.row} testID={`row-${t.rank ?? 'unranked'}`}>
          <AppText role="cell" style={tableStyles.cell}>
            {t.rank ?? '–'}
          </AppText>
          <View role="cell" style={[tableStyles.cell, styles.wide]}>
            <Link href={hrefOf(t) as never} testID={`open-treatment-${t.rank ?? 'unranked'}`}>
              <AppText style={{ color: colors.primary, textDecorationLine: 'underline' }}>
                {t.recipeName} (rev. {t.revisionNumber}) · {t.substrate}
              </AppText>
            </Link>
          </View>
          <AppText role="cell" style={tableStyles.cell}>
            {t.pairs}
          </AppText>
          <AppText role="cell" style={tableStyles.cell}>
            {formatLength(t.treatedChar.mean, units)} ± {formatLength(t.treatedChar.sd, units)}
          </AppText>
          <AppText role="cell" style={tableStyles.cell}>
            {formatLength(t.controlChar.mean, units)}
          </AppText>
          <AppText role="cell" style={tableStyles.cell}>
            {formatLength(t.difference.mean, units)}
            {t.difference.ci95
              ? ` (${formatLength(t.difference.ci95[0], units)} – ${formatLength(t.difference.ci95[1], units)})`
              : ''}
          </AppText>
          <AppText role="cell" style={tableStyles.cell}>
            {pValue(t.difference.pairedP)} / {pValue(t.difference.wilcoxonP)}
          </AppText>
          <AppText role="cell" style={tableStyles.cell}>
            {t.selfExtinguish.count}/{t.pairs}
          </AppText>
          <AppText role="cell" style={tableStyles.cell}>
            {t.pairsNeeded ?? '–'}
          </AppText>
          <AppText
            role="cell"
            style={tableStyles.cell}
            tone={t.verdict ? (t.verdict.pass ? 'ok' : 'danger') : 'muted'}
          >
            {t.verdict ? (t.verdict.pass ? 'Pass' : 'Fail') : '–'}
          </AppText>
        </View>
      ))}
    </View>
  );
}

export function RankingsScreen() {
  const { lab, can } = useLab();
  const units = useUnitSystem();
  const wide = useWindowDimensions().width >= WIDE_BREAKPOINT;
  const [filters, setFilters] = useState<RankingFilters>({ sort: 'treated_char' });
  // Typed filters apply when the field is left, not on every key stroke.
  const [from, setFrom] = useState('');
  const [to, setTo] = useState('');
  const [exposure, setExposure] = useState('');
  const applyDates = () =>
    setFilters((f) => ({
      ...f,
      from: from.trim() || undefined,
      to: to.trim() || undefined,
      exposureS: exposure.trim() || undefined,
    }));
  const ranking = useRankingQuery(lab.id, filters);
  const presets = usePresetsQuery(lab.id);
  const own = useCriteriaProfilesQuery(lab.id);
  const r = ranking.data;
  const hrefOf = (t: TreatmentStatsOutput) => treatmentHref(lab.id, t.key, filters);
  const download = (file: string) => {
    if (Platform.OS === 'web')
      window.location.assign(`/api/labs/${lab.id}/${file}?${rankingQueryString(filters)}`);
  };
  return (
    <View style={{ gap: space.lg }}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        Rankings
      </AppText>
      <AppText>
        Treatments ranked by char length, each against its own untreated controls, with the
        uncertainty shown.
      </AppText>
      {can('edit') ? (
        <Link href={`/labs/${lab.id}/rankings/import` as never} testID="open-import">
          <AppText variant="label" style={{ color: colors.primary }}>
            Import past results from a CSV file
          </AppText>
        </Link>
      ) : null}
      <Card title="Show">
        <Choice
          label="Sort by"
          options={[
            { value: 'treated_char' as const, label: 'Shortest treated char' },
            { value: 'reduction' as const, label: 'Largest reduction' },
          ]}
          value={filters.sort}
          onChange={(sort) => setFilters((f) => ({ ...f, sort }))}
          testID="sort"
        />
        <Choice
          label="Substrate"
          options={[
            { value: '', label: 'All substrates' },
            ...substrates.map((s) => ({ value: s, label: substrateLabels[s] })),
          ]}
          value={filters.substrate ?? ''}
          onChange={(substrate) => setFilters((f) => ({ ...f, substrate: substrate || undefined }))}
          testID="substrate"
        />
        <Choice
          label="Judge against"
          options={[
            { value: '', label: 'No criteria' },
            ...(own.data?.profiles ?? []).map((p) => ({
              value: p.id,
              label: `${p.name} (this lab)`,
            })),
            ...(presets.data?.presets ?? []).map((p) => ({
              value: `preset:${p.key}`,
              label: p.name,
            })),
          ]}
          value={filters.profile ?? ''}
          onChange={(profile) => setFilters((f) => ({ ...f, profile: profile || undefined }))}
          testID="profile"
        />
        <Choice
          label="Igniter"
          options={[
            { value: '', label: 'Any igniter' },
            ...igniters.map((i) => ({ value: i, label: igniterLabels[i] })),
          ]}
          value={filters.igniter ?? ''}
          onChange={(igniter) => setFilters((f) => ({ ...f, igniter: igniter || undefined }))}
          testID="igniter"
        />
        <Choice
          label="Orientation"
          options={[
            { value: '', label: 'Any orientation' },
            ...orientations.map((o) => ({ value: o, label: orientationLabels[o] })),
          ]}
          value={filters.orientation ?? ''}
          onChange={(orientation) =>
            setFilters((f) => ({ ...f, orientation: orientation || undefined }))
          }
          testID="orientation"
        />
        <View style={styles.dates}>
          <View style={{ flex: 1 }}>
            <TextField
              label="From (YYYY-MM-DD)"
              value={from}
              onChangeText={setFrom}
              onBlur={applyDates}
              testID="from"
            />
          </View>
          <View style={{ flex: 1 }}>
            <TextField
              label="To (YYYY-MM-DD)"
              value={to}
              onChangeText={setTo}
              onBlur={applyDates}
              testID="to"
            />
          </View>
          <View style={{ flex: 1 }}>
            <TextField
              label="Exposure (s)"
              value={exposure}
              onChangeText={setExposure}
              onBlur={applyDates}
              inputMode="decimal"
              testID="exposure"
            />
          </View>
        </View>
        <Choice
          label="Pairs counted"
          options={[
            { value: 'signed', label: 'Signed off only' },
            { value: 'all', label: 'Include waiting for review' },
          ]}
          value={filters.unreviewed ? 'all' : 'signed'}
          onChange={(v) => setFilters((f) => ({ ...f, unreviewed: v === 'all' }))}
          testID="unreviewed"
        />
      </Card>
      {ranking.error ? (
        <Banner
          tone="error"
          testID="ranking-error"
          message={
            ranking.error instanceof ApiError && ranking.error.fields.length
              ? ranking.error.fields.map((f) => `${f.path}: ${f.message}`).join('; ')
              : bannerMessage(ranking.error)
          }
        />
      ) : null}
      {r?.profile ? (
        <Banner
          tone="caution"
          message={`${r.profile.name}${r.profile.source ? ` (${r.profile.source})` : ''}. ${r.profile.caution}`}
          testID="profile-caution"
        />
      ) : null}
      {r?.leaderStatement ? (
        <Banner tone="info" message={r.leaderStatement} testID="leader-statement" />
      ) : null}
      {r && !r.ranked.length && !r.notEnoughPairs.length ? (
        <AppText tone="muted">No {r.onlySignedOff ? 'signed-off ' : ''}burn tests match.</AppText>
      ) : null}
      {r && r.ranked.length ? (
        <Card title="Treated char length by rank (bars: mean; lines: 95 % interval)">
          <RankingChart treatments={r.ranked} />
        </Card>
      ) : null}
      {r && r.ranked.length ? (
        wide ? (
          <TreatmentTable list={r.ranked} units={units} hrefOf={hrefOf} />
        ) : (
          r.ranked.map((t) => <TreatmentCard key={t.key} t={t} units={units} href={hrefOf(t)} />)
        )
      ) : null}
      {r && r.notEnoughPairs.length ? (
        <>
          <AppText variant="heading">Not enough pairs to rank (fewer than 3)</AppText>
          {r.notEnoughPairs.map((t) => (
            <TreatmentCard key={t.key} t={t} units={units} href={hrefOf(t)} />
          ))}
        </>
      ) : null}
      {Platform.OS === 'web' ? (
        <View style={styles.actions}>
          <Button
            label="Printable report"
            tone="secondary"
            compact
            onPress={() =>
              window.location.assign(
                `/labs/${lab.id}/rankings/report?${rankingQueryString(filters)}`,
              )
            }
            testID="open-report"
          />
          <Button
            label="Download the ranking (CSV)"
            tone="secondary"
            compact
            onPress={() => download('rankings.csv')}
            testID="csv-ranking"
          />
          <Button
            label="Download the pairs (CSV)"
            tone="secondary"
            compact
            onPress={() => download('pairs.csv')}
            testID="csv-pairs"
          />
        </View>
      ) : null}
      <Banner
        tone="caution"
        message="A bench test is not a certification: local fire codes and the Authority Having Jurisdiction decide what is accepted."
      />
    </View>
  );
}

const styles = StyleSheet.create({
  table: {
    backgroundColor: colors.surface,
    borderWidth: 1,
    borderColor: colors.line,
    borderRadius: 10,
    padding: space.md,
  },
  wide: { flex: 2.2 },
  actions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
  dates: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
});
