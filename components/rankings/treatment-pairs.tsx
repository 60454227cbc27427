import { Link } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { type UnitSystem } from '../../shared/terms/roles';
import type { TreatmentPairOutput } from '../../shared/schemas/treatment';
import { colors, space } from '../theme';
import { AppText } from '../ui/text';
import { formatLength, round } from '../units';

const seconds = (s: number | null, complete = true) =>
  s === null ? '–' : `${complete ? '' : '≥ '}${round(s, 1)} s`;

/** The pairs behind a treatment, oldest first, each linking to its own screen. */
export function TreatmentPairs({
  labId,
  pairs,
  units,
}: {
  labId: string;
  pairs: TreatmentPairOutput[];
  units: UnitSystem;
}) {
  return (
    <View role="list" style={styles.list}>
      {pairs.map((p, i) => (
        <View key={p.pairId} role="listitem" style={styles.pair} testID={`pair-row-${i + 1}`}>
          <View style={styles.head}>
            <AppText variant="label">
              Pair {i + 1} ·{' '}
              {new Date(p.heldAt).toLocaleDateString(undefined, { dateStyle: 'medium' })} · batch{' '}
              {p.batchCode}
            </AppText>
            <Link
              href={`/labs/${labId}/burn-tests/pairs/${p.pairId}` as never}
              testID={`open-pair-${i + 1}`}
            >
              <AppText variant="label" style={{ color: colors.primary }}>
                Open the pair {p.treated.code}
              </AppText>
            </Link>
          </View>
          <AppText>
            Char length: control {formatLength(p.control.charLengthMm, units)}, treated{' '}
            {formatLength(p.treated.charLengthMm, units)}
          </AppText>
          <AppText variant="small" tone="muted">
            Afterflame: control {seconds(p.control.afterflameS, p.control.afterflameComplete)},
            treated {seconds(p.treated.afterflameS, p.treated.afterflameComplete)}
            {p.treated.burnedToClamp ? ' · treated burned to the clamp' : ''}
          </AppText>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  pair: {
    gap: space.xs,
    paddingBottom: space.sm,
    borderBottomWidth: 1,
    borderBottomColor: colors.line,
  },
  head: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    justifyContent: 'space-between',
    columnGap: space.md,
  },
});
