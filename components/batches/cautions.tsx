import { Pressable, StyleSheet, View } from 'react-native';
import type { Chemical } from '../../shared/schemas/chemical';
import { colors, radius, space } from '../theme';
import { AppText } from '../ui/text';

/** Our own wording of the cautions each caution key stands for, shown before mixing. */
export const cautionText: Record<string, string> = {
  reprotoxic_borate:
    'Borates (boric acid, borax) may damage fertility or the unborn child (H360FD). Anyone pregnant or trying for a child should not handle them.',
  eye_irritant:
    'Borax irritates the eyes (H319): wear eye protection; rinse with water for several minutes if splashed.',
  dust: 'Wear chemical-resistant gloves and eye protection; wear a dust mask while weighing powders, and weigh where there is no draught.',
  warm_ammonium_phosphate:
    'Warm ammonium phosphate solutions give off ammonia: mix with ventilation, and never boil them (they break down near 70 °C).',
  ammonium_no_bleach:
    'Never mix ammonium salts or their solutions with bleach: the gases formed are toxic.',
  disposal:
    'Dispose of spent solution according to local rules: not down a storm drain, and not on plants (boron harms them).',
};

export function cautionsFor(chemicals: Chemical[]): string[] {
  const keys = new Set(chemicals.flatMap((c) => c.cautions));
  return Object.keys(cautionText)
    .filter((k) => keys.has(k))
    .map((k) => cautionText[k]!);
}

/** The cautions for a batch's chemicals, and the tick that the operator has read them. */
export function Cautions({
  chemicals,
  acknowledged,
  onToggle,
}: {
  chemicals: Chemical[];
  acknowledged: boolean;
  onToggle: () => void;
}) {
  const hazards = chemicals.flatMap((c) => c.hazards.map((h) => `${c.name}: ${h.code} ${h.text}`));
  return (
    <View style={styles.box} testID="cautions">
      <AppText variant="heading">Before you mix</AppText>
      {cautionsFor(chemicals).map((line) => (
        <AppText key={line}>• {line}</AppText>
      ))}
      {hazards.length ? (
        <AppText variant="small" tone="muted">
          Hazard statements: {hazards.join('; ')}
        </AppText>
      ) : null}
      <Pressable
        role="checkbox"
        aria-checked={acknowledged}
        testID="cautions-ack"
        onPress={onToggle}
        style={[styles.tick, acknowledged && styles.tickOn]}
      >
        <View style={[styles.square, acknowledged && styles.squareOn]}>
          {acknowledged ? <AppText style={styles.check}>✓</AppText> : null}
        </View>
        <AppText variant="label" style={{ flex: 1 }}>
          I have read these cautions and have the protection they call for.
        </AppText>
      </Pressable>
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    backgroundColor: colors.cautionBg,
    borderLeftWidth: 6,
    borderLeftColor: colors.caution,
    borderRadius: radius.md,
    padding: space.lg,
    gap: space.sm,
  },
  tick: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    minHeight: 48,
    paddingTop: space.sm,
  },
  tickOn: {},
  square: {
    width: 28,
    height: 28,
    borderWidth: 2,
    borderColor: colors.ink,
    borderRadius: 4,
    alignItems: 'center',
    justifyContent: 'center',
    backgroundColor: colors.surface,
  },
  squareOn: { backgroundColor: colors.primary, borderColor: colors.primary },
  check: { color: colors.onPrimary, fontSize: 18, lineHeight: 20 },
});
