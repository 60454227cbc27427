import { Link } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import type { Chemical } from '../../shared/schemas/chemical';
import { ApiError } from '../api/client';
import { bannerMessage } from '../api/error-messages';
import { useChemicalQuery } from '../api/recipes';
import { useLab } from '../lab-context';
import { colors, space } from '../theme';
import { Banner } from '../ui/banner';
import { Card } from '../ui/card';
import { AppText } from '../ui/text';
import { formatTemperature, useUnitSystem } from '../units';
import {
  chemicalHandle,
  confidenceWords,
  HazardBadge,
  NO_SOLUBILITY,
  OriginTag,
} from './chemicals-screen';
import { cautionText } from '../batches/cautions';

const basisWords: Record<string, string> = {
  g_per_100g_water: 'g per 100 g water',
  mass_percent: '% of solution',
};

type Solubility = NonNullable<Chemical['solubility']>;

function countsAnhydrous(s: Solubility): boolean {
  return s.solute === 'anhydrous';
}

function notFound(error: unknown): boolean {
  return (
    error instanceof ApiError && (error.code === 'not_found' || error.code === 'invalid_request')
  );
}

function Fact({ label, value, testID }: { label: string; value: string; testID?: string }) {
  return (
    <View style={styles.fact} testID={testID}>
      <AppText variant="label" tone="muted" style={styles.factLabel}>
        {label}
      </AppText>
      <AppText style={styles.factValue}>{value}</AppText>
    </View>
  );
}

function SolubilityTable({ solubility }: { solubility: Solubility }) {
  const system = useUnitSystem();
  const points = solubility.points ?? [];
  const basis = solubility.basis ? (basisWords[solubility.basis] ?? solubility.basis) : '';
  const valueHeader = [basis, countsAnhydrous(solubility) ? 'anhydrous basis' : '']
    .filter(Boolean)
    .join(', ');
  return (
    <View
      role="table"
      aria-label={`Solubility by temperature${valueHeader ? `, in ${valueHeader}` : ''}`}
      style={styles.table}
      testID="solubility-table"
    >
      <View role="row" style={[styles.row, styles.headRow]}>
        <AppText variant="label" role="columnheader" style={styles.cell}>
          Temperature
        </AppText>
        <AppText variant="label" role="columnheader" style={styles.cell}>
          {valueHeader ? `Solubility (${valueHeader})` : 'Solubility'}
        </AppText>
      </View>
      {points.map((p) => (
        <View key={p.tempC} role="row" style={styles.row} testID={`solubility-row-${p.tempC}`}>
          <AppText role="cell" style={styles.cell}>
            {formatTemperature(p.tempC, system)}
          </AppText>
          <AppText role="cell" style={styles.cell}>
            {basis ? `${p.value} ${basis}` : p.value}
          </AppText>
        </View>
      ))}
    </View>
  );
}

function SolubilitySection({ solubility }: { solubility: Chemical['solubility'] }) {
  if (!solubility) {
    return <AppText testID="solubility-none">{NO_SOLUBILITY}.</AppText>;
  }
  return (
    <View style={styles.stack}>
      <AppText testID="solubility-summary">{solubility.summary}.</AppText>
      {solubility.kind === 'table' ? (
        <SolubilityTable solubility={solubility} />
      ) : (
        <AppText tone="muted">
          A fitted curve over the temperatures named above; the calculator does not extrapolate
          beyond them.
        </AppText>
      )}
      {solubility.kind === 'table' && countsAnhydrous(solubility) ? (
        <AppText variant="small" tone="muted">
          Anhydrous basis: the values count the salt without its water of crystallisation, whichever
          hydrate you weigh.
        </AppText>
      ) : null}
      <Fact label="Source" value={solubility.source} testID="solubility-source" />
      <Fact
        label="Confidence"
        value={confidenceWords[solubility.confidence]}
        testID="solubility-confidence"
      />
    </View>
  );
}

export function ChemicalScreen({ chemicalId }: { chemicalId: string }) {
  const { lab } = useLab();
  const query = useChemicalQuery(lab.id, chemicalId);
  const c = query.data;

  const back = (
    <Link href={`/labs/${lab.id}/chemicals` as never} testID="link-chemicals" style={styles.link}>
      <AppText variant="label" style={{ color: colors.primary }}>
        ← All chemicals
      </AppText>
    </Link>
  );

  if (query.error) {
    return (
      <View style={styles.screen}>
        {back}
        <Banner
          tone="error"
          testID="chemical-error"
          message={
            notFound(query.error)
              ? "This chemical is not in this lab's library."
              : bannerMessage(query.error)
          }
        />
      </View>
    );
  }
  if (!c) {
    return (
      <View style={styles.screen}>
        {back}
        <AppText tone="muted">Loading the chemical…</AppText>
      </View>
    );
  }

  return (
    <View style={styles.screen} testID={`chemical-${chemicalHandle(c)}`}>
      {back}
      <View style={styles.titleRow}>
        <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
          {c.name}
        </AppText>
        <OriginTag reference={c.reference} />
      </View>

      <Card testID="chemical-facts" gap="sm">
        <AppText variant="heading" accessibilityRole="header" aria-level={2}>
          Data
        </AppText>
        <Fact label="Formula" value={c.formula ?? 'Not given'} />
        <Fact
          label="Molar mass"
          value={c.molarMass !== null ? `${c.molarMass.toFixed(2)} g/mol` : 'Not given'}
        />
        <Fact
          label="Boron"
          value={
            c.boronPercent !== null ? `${c.boronPercent.toFixed(2)} % by mass` : 'Contains no boron'
          }
        />
        <Fact
          label="Library"
          value={
            c.reference
              ? 'Reference chemical, shared by every lab'
              : `Added by ${lab.name}; only this lab sees it`
          }
        />
        {c.notes ? <Fact label="Notes" value={c.notes} /> : null}
      </Card>

      <Card testID="chemical-hazards" gap="sm">
        <AppText variant="heading" accessibilityRole="header" aria-level={2}>
          Hazards
        </AppText>
        {c.hazards.length === 0 ? (
          <AppText tone="muted">No hazard statements recorded.</AppText>
        ) : (
          c.hazards.map((h) => (
            <View key={h.code} style={styles.hazard}>
              <HazardBadge code={h.code} />
              <AppText style={styles.hazardText}>{h.text}</AppText>
            </View>
          ))
        )}
        {c.cautions.length ? (
          <View style={styles.stack} testID="chemical-cautions">
            <AppText variant="label">When handling it</AppText>
            {c.cautions.map((key) => (
              <AppText key={key}>• {cautionText[key] ?? key}</AppText>
            ))}
          </View>
        ) : null}
      </Card>

      <Card testID="chemical-solubility" gap="sm">
        <AppText variant="heading" accessibilityRole="header" aria-level={2}>
          Solubility in water
        </AppText>
        <SolubilitySection solubility={c.solubility} />
      </Card>
    </View>
  );
}

const styles = StyleSheet.create({
  screen: { gap: space.lg },
  stack: { gap: space.sm },
  link: { paddingVertical: space.xs },
  titleRow: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.md },
  fact: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.md, rowGap: 2 },
  factLabel: { minWidth: 110 },
  factValue: { flex: 1, minWidth: 180 },
  hazard: { flexDirection: 'row', alignItems: 'flex-start', gap: space.sm },
  hazardText: { flex: 1 },
  table: { borderTopWidth: 1, borderTopColor: colors.line, maxWidth: 520 },
  row: {
    flexDirection: 'row',
    gap: space.md,
    paddingVertical: space.xs,
    borderBottomWidth: 1,
    borderBottomColor: colors.line,
  },
  headRow: { borderBottomWidth: 2, borderBottomColor: colors.ink },
  cell: { flex: 1 },
});
