import { Link } from 'expo-router';
import type { ReactNode } from 'react';
import { ScrollView, StyleSheet, useWindowDimensions, View } from 'react-native';
import { type UnitSystem } from '../../shared/terms/roles';
import { amountUnitLabels, substrateLabels } from '../../shared/terms/recipe';
import type { Revision } from '../../shared/schemas/recipe';
import { ApiError } from '../api/client';
import { bannerMessage } from '../api/error-messages';
import { useRecipeQuery, useRevisionsQuery } from '../api/recipes';
import { useLab } from '../lab-context';
import { colors, fonts, radius, space, WIDE_BREAKPOINT } from '../theme';
import { Banner } from '../ui/banner';
import { AppText } from '../ui/text';
import { formatDuration, formatTemperature, formatWhen, round, useUnitSystem } from '../units';

const dryingMethodWords: Record<Revision['dryingMethod'], string> = {
  air: 'Air, hanging or laid flat',
  rack: 'On a rack',
  oven: 'In an oven',
  press: 'In a press',
  other: 'Other',
};

/** One line of a revision; `raw` is what is compared with the older revision. */
type Line = {
  key: string;
  label: string;
  show: (r: Revision, system: UnitSystem) => string;
  raw: (r: Revision) => unknown;
};

const lines: Line[] = [
  {
    key: 'waterParts',
    label: 'Parts of water',
    show: (r) => (r.waterParts === null ? '–' : round(r.waterParts, 4)),
    raw: (r) => r.waterParts,
  },
  {
    key: 'mixingTemp',
    label: 'Mixing temperature',
    show: (r, s) => formatTemperature(r.mixingTempC, s),
    raw: (r) => r.mixingTempC,
  },
  {
    key: 'soak',
    label: 'Soak',
    show: (r) => formatDuration(r.soakMinutes),
    raw: (r) => r.soakMinutes,
  },
  {
    key: 'drain',
    label: 'Drain',
    show: (r) => formatDuration(r.drainMinutes),
    raw: (r) => r.drainMinutes,
  },
  {
    key: 'dryingMethod',
    label: 'Drying',
    show: (r) => dryingMethodWords[r.dryingMethod],
    raw: (r) => r.dryingMethod,
  },
  {
    key: 'dryingTime',
    label: 'Drying time',
    show: (r) => formatDuration(r.dryingMinutes),
    raw: (r) => r.dryingMinutes,
  },
  {
    key: 'dryingTemp',
    label: 'Drying temperature',
    show: (r, s) => formatTemperature(r.dryingTempC, s),
    raw: (r) => r.dryingTempC,
  },
  {
    key: 'dryingRh',
    label: 'Drying humidity',
    show: (r) => (r.dryingRhPct === null ? '–' : `${round(r.dryingRhPct, 1)} % RH`),
    raw: (r) => r.dryingRhPct,
  },
  {
    key: 'conditioning',
    label: 'Conditioning',
    show: (r) => r.conditioning ?? '–',
    raw: (r) => r.conditioning,
  },
  { key: 'notes', label: 'Notes', show: (r) => r.notes ?? '–', raw: (r) => r.notes },
];

function usage(count: number): string {
  if (count === 0) return 'Not used yet: can still be edited';
  return `Frozen: used by ${count} batch${count === 1 ? '' : 'es'}`;
}

function ChangedTag({ words = 'changed' }: { words?: string }) {
  return (
    <View style={styles.tag}>
      <AppText variant="small" style={styles.tagText}>
        {words}
      </AppText>
    </View>
  );
}

function Value({
  label,
  value,
  changed,
  testID,
}: {
  label: string;
  value: string;
  changed: boolean;
  testID: string;
}) {
  return (
    <View style={styles.value} testID={testID}>
      <AppText variant="small" tone="muted">
        {label}
      </AppText>
      <View style={styles.valueRow}>
        <AppText
          style={[styles.valueText, changed && styles.changedText]}
          testID={changed ? 'changed-value' : undefined}
        >
          {value}
        </AppText>
        {changed ? <ChangedTag /> : null}
      </View>
    </View>
  );
}

function Ingredients({ revision, older }: { revision: Revision; older: Revision | undefined }) {
  const removed = older
    ? older.ingredients.filter(
        (o) => !revision.ingredients.some((i) => i.chemicalId === o.chemicalId),
      )
    : [];
  return (
    <View style={styles.ingredients}>
      <AppText variant="label">Ingredients</AppText>
      {revision.ingredients.map((i) => {
        const before = older?.ingredients.find((o) => o.chemicalId === i.chemicalId);
        const added = older !== undefined && before === undefined;
        const changed =
          before !== undefined && (before.amount !== i.amount || before.unit !== i.unit);
        return (
          <View key={i.chemicalId} style={styles.ingredient} testID={`ingredient-${i.chemicalId}`}>
            <View style={styles.valueRow}>
              <AppText
                variant="label"
                style={[styles.valueText, (added || changed) && styles.changedText]}
              >
                {i.chemicalName}
              </AppText>
              {added ? <ChangedTag words="new" /> : null}
              {changed ? <ChangedTag /> : null}
            </View>
            <AppText style={(added || changed) && styles.changedText}>
              {round(i.amount, 4)} {amountUnitLabels[i.unit]}
            </AppText>
            <AppText variant="small" tone="muted">
              {round(i.gPer100gWater, 2)} g per 100 g water
            </AppText>
          </View>
        );
      })}
      {removed.map((o) => (
        <View key={o.chemicalId} style={styles.valueRow} testID={`removed-${o.chemicalId}`}>
          <AppText style={[styles.removed, styles.changedText]}>{o.chemicalName}</AppText>
          <ChangedTag words="removed" />
        </View>
      ))}
    </View>
  );
}

function RevisionColumn({
  revision,
  older,
  newest,
  wide,
  shown,
}: {
  revision: Revision;
  older: Revision | undefined;
  newest: boolean;
  wide: boolean;
  shown: Line[];
}) {
  const system = useUnitSystem();
  const r = revision;
  return (
    <View
      style={[styles.column, wide && styles.columnWide]}
      role="group"
      aria-label={`Revision ${r.number}`}
      testID={`revision-${r.number}`}
    >
      <View style={styles.columnHead}>
        <View style={styles.valueRow}>
          <AppText variant="heading" accessibilityRole="header" aria-level={2}>
            Revision {r.number}
          </AppText>
          {newest ? (
            <View style={styles.current}>
              <AppText variant="small" style={styles.currentText}>
                current
              </AppText>
            </View>
          ) : null}
        </View>
        <AppText variant="small">
          {formatWhen(r.createdAt)} · {r.createdBy ?? 'author unknown'}
        </AppText>
        <AppText
          variant="small"
          tone={r.batchCount > 0 ? 'ink' : 'muted'}
          testID={`revision-${r.number}-usage`}
        >
          {usage(r.batchCount)}
        </AppText>
        <AppText variant="small" tone="muted">
          {older ? `Compared with revision ${older.number}` : 'The first revision'}
        </AppText>
      </View>
      <Ingredients revision={r} older={older} />
      {shown.map((line) => (
        <Value
          key={line.key}
          label={line.label}
          value={line.show(r, system)}
          changed={older !== undefined && line.raw(older) !== line.raw(r)}
          testID={`revision-${r.number}-${line.key}`}
        />
      ))}
    </View>
  );
}

function notFound(error: unknown): boolean {
  return (
    error instanceof ApiError && (error.code === 'not_found' || error.code === 'invalid_request')
  );
}

export function RecipeHistoryScreen({ recipeId }: { recipeId: string }) {
  const { lab } = useLab();
  const wide = useWindowDimensions().width >= WIDE_BREAKPOINT;
  const recipe = useRecipeQuery(lab.id, recipeId);
  const revisions = useRevisionsQuery(lab.id, recipeId);
  const list = [...(revisions.data?.revisions ?? [])].sort((a, b) => b.number - a.number);
  const error = recipe.error ?? revisions.error;
  // Parts of water only matter to recipes given in parts by mass.
  const shown = list.some((r) => r.waterParts !== null)
    ? lines
    : lines.filter((l) => l.key !== 'waterParts');

  const back = (
    <Link
      href={`/labs/${lab.id}/recipes/${recipeId}` as never}
      testID="link-recipe"
      style={styles.link}
    >
      <AppText variant="label" style={{ color: colors.primary }}>
        ← Back to the recipe
      </AppText>
    </Link>
  );

  let body: ReactNode;
  if (error) {
    body = (
      <Banner
        tone="error"
        testID="history-error"
        message={notFound(error) ? 'This recipe is not in this lab.' : bannerMessage(error)}
      />
    );
  } else if (!revisions.data) {
    body = <AppText tone="muted">Loading the revisions…</AppText>;
  } else {
    const columns = list.map((r, index) => (
      <RevisionColumn
        key={r.id}
        revision={r}
        older={list[index + 1]}
        newest={index === 0}
        wide={wide}
        shown={shown}
      />
    ));
    body = wide ? (
      <ScrollView
        horizontal
        contentContainerStyle={styles.rowContent}
        testID="revisions"
        aria-label="Revisions, newest first"
      >
        {columns}
      </ScrollView>
    ) : (
      <View style={styles.stack} testID="revisions">
        {columns}
      </View>
    );
  }

  return (
    <View style={styles.screen}>
      {back}
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        Recipe history
      </AppText>
      {recipe.data ? (
        <AppText testID="history-recipe">
          {recipe.data.name} · {substrateLabels[recipe.data.substrate]} ·{' '}
          {recipe.data.revisionCount === 1
            ? 'one revision'
            : `${recipe.data.revisionCount} revisions`}
        </AppText>
      ) : null}
      <AppText tone="muted">
        Newest first. Values that differ from the revision before are in bold and marked. Once a
        batch uses a revision it is frozen, and an edit makes a new one.
      </AppText>
      {body}
    </View>
  );
}

const styles = StyleSheet.create({
  screen: { gap: space.lg },
  link: { paddingVertical: space.xs },
  stack: { gap: space.lg },
  rowContent: { gap: space.md, paddingBottom: space.sm, alignItems: 'flex-start' },
  column: {
    backgroundColor: colors.surface,
    borderColor: colors.line,
    borderWidth: 1,
    borderRadius: radius.md,
    padding: space.lg,
    gap: space.md,
  },
  columnWide: { width: 300 },
  columnHead: {
    gap: 2,
    paddingBottom: space.sm,
    borderBottomWidth: 1,
    borderBottomColor: colors.line,
  },
  current: {
    backgroundColor: colors.navActiveBg,
    borderRadius: radius.sm,
    paddingHorizontal: space.sm,
  },
  currentText: { color: colors.navActiveText, fontFamily: fonts.semibold },
  ingredients: { gap: space.sm },
  ingredient: {
    gap: 0,
    paddingLeft: space.sm,
    borderLeftWidth: 3,
    borderLeftColor: colors.line,
  },
  value: { gap: 0 },
  valueRow: { flexDirection: 'row', alignItems: 'center', flexWrap: 'wrap', gap: space.sm },
  valueText: { flexShrink: 1 },
  changedText: { fontFamily: fonts.bold },
  removed: { textDecorationLine: 'line-through', flexShrink: 1 },
  tag: {
    backgroundColor: '#E8F1F3',
    borderColor: colors.primary,
    borderWidth: 1,
    borderRadius: radius.sm,
    paddingHorizontal: space.xs,
  },
  tagText: { color: colors.primary, fontSize: 12, lineHeight: 16, fontFamily: fonts.semibold },
});
