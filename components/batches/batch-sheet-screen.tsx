import { Link } from 'expo-router';
import type { ComponentProps, ReactNode } from 'react';
import { Platform, ScrollView, StyleSheet, View } from 'react-native';
import { type BatchStatus } from '../../shared/terms/batch';
import type { Batch } from '../../shared/schemas/batch';
import { type UnitSystem } from '../../shared/terms/roles';
import { fromMillilitres, ML_PER_US_GAL } from '../../shared/units';
import { ApiError } from '../api/client';
import { bannerMessage } from '../api/error-messages';
import { useBatchQuery } from '../api/batches';
import { useLab } from '../lab-context';
import { colors, fonts, space } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { printHide, printPage as print, usePrintStyle } from '../ui/print';
import { AppText } from '../ui/text';
import { cautionText } from './cautions';
import { formatTemperature, formatWeighMass, formatWhen, round, useUnitSystem } from '../units';

// A plain sheet for the wall or the binder: pure black on white, whatever the app's palette.
const BLACK = '#000000';
const WHITE = '#FFFFFF';

/** Empty specimen rows to fill in by hand at the bench. */
const BLANK_SPECIMEN_ROWS = 6;

const statusWords: Record<BatchStatus, string> = {
  prepared: 'Prepared',
  in_use: 'In use',
  used_up: 'Used up',
  discarded: 'Discarded',
};

const CAUTIONS = [
  ...Object.values(cautionText),
  'This sheet is not a certification. Local fire codes and the Authority Having Jurisdiction decide whether a treated material is acceptable.',
];

function Ink({ style, ...rest }: Omit<ComponentProps<typeof AppText>, 'tone'>) {
  return <AppText {...rest} style={[styles.ink, style]} />;
}

function formatVolume(ml: number, system: UnitSystem): string {
  if (!Number.isFinite(ml)) return '–';
  if (system === 'metric') return ml >= 1000 ? `${round(ml / 1000, 2)} L` : `${round(ml, 0)} mL`;
  const us =
    ml >= ML_PER_US_GAL
      ? `${round(fromMillilitres(ml, 'gal'), 2)} gal`
      : `${round(fromMillilitres(ml, 'qt'), 2)} qt`;
  return `${us} (${round(ml, 0)} mL)`;
}

function targetWords(target: Batch['target'], system: UnitSystem): string {
  switch (target.basis) {
    case 'solution_mass':
      return `${formatWeighMass(target.grams, system)} of solution`;
    case 'water_mass':
      return `${formatWeighMass(target.grams, system)} of water`;
    case 'water_volume':
      return `${formatVolume(target.millilitres, system)} of water`;
  }
}

const pct = (value: number | null, digits = 1) =>
  value === null || !Number.isFinite(value) ? '' : `${round(value, digits)} %`;

const signedPct = (value: number) => `${value > 0 ? '+' : ''}${round(value, 2)} %`;

function Field({ label, value, testID }: { label: string; value: string; testID?: string }) {
  return (
    <View style={styles.field} testID={testID}>
      <Ink variant="small" style={styles.fieldLabel}>
        {label}
      </Ink>
      <Ink style={styles.fieldValue}>{value}</Ink>
    </View>
  );
}

function Section({
  title,
  children,
  testID,
}: {
  title: string;
  children: ReactNode;
  testID?: string;
}) {
  return (
    <View style={styles.section} testID={testID}>
      <Ink variant="heading" accessibilityRole="header" aria-level={2} style={styles.sectionTitle}>
        {title}
      </Ink>
      {children}
    </View>
  );
}

type Column = { label: string; flex?: number };
type Row = { key: string; cells: string[]; testID?: string; strong?: boolean[] };

function SheetTable({ label, columns, rows }: { label: string; columns: Column[]; rows: Row[] }) {
  return (
    // Narrow phones scroll the table sideways; on paper it fits the page width. Focusable, so
    // the keyboard can scroll it too.
    <ScrollView
      horizontal
      focusable
      role="region"
      aria-label={label}
      contentContainerStyle={styles.tableScroll}
    >
      <View role="table" aria-label={label} style={styles.table}>
        <View role="row" style={[styles.tr, styles.thead]}>
          {columns.map((c, i) => (
            <View
              key={c.label}
              role="columnheader"
              style={[styles.td, { flex: c.flex ?? 1 }, i === columns.length - 1 && styles.tdLast]}
            >
              <Ink variant="small" style={styles.th}>
                {c.label}
              </Ink>
            </View>
          ))}
        </View>
        {rows.map((row) => (
          <View key={row.key} role="row" style={styles.tr} testID={row.testID}>
            {columns.map((c, i) => (
              <View
                key={c.label}
                role="cell"
                style={[
                  styles.td,
                  { flex: c.flex ?? 1 },
                  i === columns.length - 1 && styles.tdLast,
                ]}
              >
                <Ink variant="small" style={row.strong?.[i] ? styles.strong : undefined}>
                  {row.cells[i] ?? ''}
                </Ink>
              </View>
            ))}
          </View>
        ))}
      </View>
    </ScrollView>
  );
}

function SignatureLine({ label }: { label: string }) {
  return (
    <View style={styles.signature}>
      <View style={styles.signLine} />
      <Ink variant="small">{label}</Ink>
    </View>
  );
}

function notFound(error: unknown): boolean {
  return (
    error instanceof ApiError && (error.code === 'not_found' || error.code === 'invalid_request')
  );
}

function Sheet({ batch, labName }: { batch: Batch; labName: string }) {
  const system = useUnitSystem();
  const b = batch;
  const plan = b.plan;
  const blank = Array.from({ length: BLANK_SPECIMEN_ROWS }, (_, i) => i);

  const ingredientRows: Row[] = b.weighIns.map((w) => ({
    key: w.chemicalId,
    testID: `sheet-weighin-${w.chemicalId}`,
    cells: [
      w.name,
      formatWeighMass(w.targetG, system),
      formatWeighMass(w.weighedG, system),
      signedPct(w.deviationPct),
      w.flagged ? 'OUT of tolerance' : 'Within',
      w.lot ?? '',
    ],
    strong: [false, false, false, w.flagged, w.flagged, false],
  }));

  const specimenRows: Row[] = [
    ...b.specimens.map((s) => ({
      key: s.id,
      testID: `sheet-specimen-${s.code}`,
      cells: [
        s.code,
        s.substrate,
        formatWeighMass(s.dryMassBeforeG, system),
        s.wetMassG === null ? '' : formatWeighMass(s.wetMassG, system),
        s.dryMassAfterG === null ? '' : formatWeighMass(s.dryMassAfterG, system),
        pct(s.addOnPct),
        pct(s.pickUpPct),
      ],
    })),
    ...blank.map((i) => ({
      key: `blank-${i}`,
      testID: 'sheet-specimen-blank',
      cells: ['', '', '', '', '', '', ''],
    })),
  ];

  return (
    <View style={styles.sheet} testID="batch-sheet">
      <View style={styles.header}>
        <Ink variant="label">{labName}</Ink>
        <Ink variant="label" accessibilityRole="header" aria-level={1} testID="section-title">
          Batch sheet
        </Ink>
        <Ink style={styles.code} testID="sheet-code">
          {b.code}
        </Ink>
        <Ink testID="sheet-status">
          {statusWords[b.status]}
          {b.status === 'discarded' && b.discardReason ? `: ${b.discardReason}` : ''}
        </Ink>
      </View>

      <View style={styles.fields}>
        <Field
          label="Recipe"
          value={`${b.recipe.name}, revision ${b.recipe.revisionNumber}`}
          testID="sheet-recipe"
        />
        <Field label="Prepared at" value={formatWhen(b.preparedAt)} />
        <Field label="Operator" value={b.operator ?? '________________'} />
        <Field label="Batch size (target)" value={targetWords(b.target, system)} />
        <Field
          label="Makes"
          value={`${formatWeighMass(plan.solutionMassG, system)} of solution from ${formatWeighMass(
            plan.waterMassG,
            system,
          )} of water (${formatVolume(plan.waterVolumeMl, system)})`}
        />
        <Field label="Storage temperature" value={formatTemperature(b.storageTempC, system)} />
        {b.waterTempC !== null ? (
          <Field label="Water temperature" value={formatTemperature(b.waterTempC, system)} />
        ) : null}
        {b.ph !== null ? <Field label="pH" value={round(b.ph, 2)} /> : null}
        {b.densityGMl !== null ? (
          <Field label="Density" value={`${round(b.densityGMl, 3)} g/mL`} />
        ) : null}
      </View>

      <Section title="Ingredients" testID="sheet-ingredients">
        <SheetTable
          label="Ingredients weighed"
          columns={[
            { label: 'Chemical', flex: 1.6 },
            { label: 'Target' },
            { label: 'Weighed' },
            { label: 'Deviation', flex: 0.8 },
            { label: `Flag (±${round(b.tolerancePct, 2)} %)`, flex: 0.9 },
            { label: 'Lot', flex: 0.9 },
          ]}
          rows={ingredientRows}
        />
        {b.anyOutOfTolerance ? (
          <Ink style={styles.strong} testID="sheet-out-of-tolerance">
            At least one chemical was weighed outside the tolerance of ±{round(b.tolerancePct, 2)}{' '}
            %.
          </Ink>
        ) : null}
      </Section>

      <Section title="Solution" testID="sheet-totals">
        <View style={styles.fields}>
          <Field label="Total solids" value={pct(plan.totalSolidsPercent, 2)} />
          <Field label="Boron" value={pct(plan.boronPercent, 3)} />
          <Field
            label="Boric-acid equivalent"
            value={formatWeighMass(plan.boricAcidEquivalentG, system)}
          />
          <Field label="B2O3 equivalent" value={formatWeighMass(plan.b2o3EquivalentG, system)} />
        </View>
        {plan.combinedBorate ? <Ink variant="small">{plan.combinedBorate.note}</Ink> : null}
      </Section>

      <Section title="Warnings" testID="sheet-warnings">
        {plan.warnings.length === 0 ? (
          <Ink>None from the calculator.</Ink>
        ) : (
          plan.warnings.map((w, i) => (
            <Ink key={`${w.code}-${i}`} testID="sheet-warning">
              • {w.message}
            </Ink>
          ))
        )}
      </Section>

      <Section title="Timers" testID="sheet-timers">
        <View style={styles.fields}>
          <Field
            label="Soak started"
            value={b.soakStartedAt ? formatWhen(b.soakStartedAt) : '________________'}
          />
          <Field
            label="Soak ends at"
            value={b.soakEndsAt ? formatWhen(b.soakEndsAt) : '________________'}
          />
          <Field
            label="Drying ready at"
            value={b.dryingReadyAt ? formatWhen(b.dryingReadyAt) : '________________'}
          />
        </View>
      </Section>

      <View style={styles.cautions} testID="sheet-cautions">
        <Ink variant="heading" accessibilityRole="header" aria-level={2}>
          Cautions
        </Ink>
        {CAUTIONS.map((line) => (
          <Ink key={line}>• {line}</Ink>
        ))}
      </View>

      <Section title="Specimen log" testID="sheet-specimens">
        <SheetTable
          label="Specimens treated with this batch"
          columns={[
            { label: 'Code', flex: 0.8 },
            { label: 'Substrate' },
            { label: 'Dry before' },
            { label: 'Wet' },
            { label: 'Dry after' },
            { label: 'Add-on', flex: 0.7 },
            { label: 'Pick-up', flex: 0.7 },
          ]}
          rows={specimenRows}
        />
        <Ink variant="small">
          Add-on: dry mass gained, % of the untreated dry mass. Pick-up: solution taken up while
          soaking, % of the untreated dry mass.
        </Ink>
      </Section>

      {b.notes ? (
        <Section title="Notes">
          <Ink>{b.notes}</Ink>
        </Section>
      ) : null}

      <View style={styles.signatures} testID="sheet-signatures">
        <SignatureLine label="Prepared by (name, signature)" />
        <SignatureLine label="Date" />
        <SignatureLine label="Checked by (name, signature)" />
        <SignatureLine label="Date" />
      </View>
    </View>
  );
}

export function BatchSheetScreen({ batchId }: { batchId: string }) {
  const { lab } = useLab();
  const batch = useBatchQuery(lab.id, batchId);
  usePrintStyle();

  return (
    <View style={styles.screen}>
      <View style={styles.actions} {...printHide}>
        <Link
          href={`/labs/${lab.id}/batches/${batchId}` as never}
          testID="link-batch"
          style={styles.link}
        >
          <AppText variant="label" style={{ color: colors.primary }}>
            ← Back to the batch
          </AppText>
        </Link>
        {Platform.OS === 'web' && batch.data ? (
          <Button label="Print" compact onPress={print} testID="print-sheet" {...printHide} />
        ) : null}
      </View>
      {batch.error ? (
        <Banner
          tone="error"
          testID="sheet-error"
          message={
            notFound(batch.error) ? 'This batch is not in this lab.' : bannerMessage(batch.error)
          }
        />
      ) : null}
      {batch.isPending ? <AppText tone="muted">Loading the batch…</AppText> : null}
      {batch.data ? <Sheet batch={batch.data} labName={lab.name} /> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  screen: { gap: space.lg },
  actions: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.md,
  },
  link: { paddingVertical: space.xs },
  ink: { color: BLACK },
  strong: { fontFamily: fonts.bold },
  sheet: {
    backgroundColor: WHITE,
    borderWidth: 1,
    borderColor: BLACK,
    padding: space.xl,
    gap: space.xl,
  },
  header: { gap: 2, borderBottomWidth: 2, borderBottomColor: BLACK, paddingBottom: space.md },
  code: { fontFamily: fonts.bold, fontSize: 40, lineHeight: 46 },
  fields: { gap: space.xs },
  field: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.md, rowGap: 0 },
  fieldLabel: { width: 170, fontFamily: fonts.semibold, paddingTop: 3 },
  fieldValue: { flex: 1, minWidth: 180 },
  section: { gap: space.sm },
  sectionTitle: { fontSize: 20, lineHeight: 26 },
  tableScroll: { flexGrow: 1 },
  table: { flex: 1, minWidth: 560, borderWidth: 1, borderBottomWidth: 0, borderColor: BLACK },
  tr: { flexDirection: 'row', borderBottomWidth: 1, borderBottomColor: BLACK, minHeight: 34 },
  thead: { borderBottomWidth: 2 },
  td: {
    borderRightWidth: 1,
    borderRightColor: BLACK,
    paddingHorizontal: space.xs,
    paddingVertical: space.xs,
    justifyContent: 'center',
  },
  tdLast: { borderRightWidth: 0 },
  th: { fontFamily: fonts.semibold },
  cautions: { borderWidth: 2, borderColor: BLACK, padding: space.md, gap: space.xs },
  signatures: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.xl, rowGap: space.lg },
  signature: { flexGrow: 1, flexBasis: 220, gap: 2, paddingTop: space.xl },
  signLine: { borderBottomWidth: 1, borderBottomColor: BLACK },
});
