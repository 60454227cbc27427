import { ActivityIndicator, Pressable, StyleSheet, type PressableProps } from 'react-native';
import { colors, radius, space } from '../theme';
import { AppText } from './text';

type Props = Omit<PressableProps, 'children' | 'style'> & {
  label: string;
  tone?: 'primary' | 'secondary' | 'danger';
  busy?: boolean;
  compact?: boolean;
};

export function Button({ label, tone = 'primary', busy, compact, disabled, ...rest }: Props) {
  const off = disabled || busy;
  return (
    <Pressable
      accessibilityRole="button"
      accessibilityState={{ disabled: Boolean(off), busy: Boolean(busy) }}
      disabled={off}
      {...rest}
      style={[
        styles.base,
        compact && styles.compact,
        tone === 'primary' && styles.primary,
        tone === 'secondary' && styles.secondary,
        tone === 'danger' && styles.danger,
        off && styles.off,
      ]}
    >
      {busy ? (
        <ActivityIndicator color={tone === 'secondary' ? colors.primary : colors.onPrimary} />
      ) : null}
      <AppText
        variant="label"
        style={{
          color: tone === 'secondary' ? colors.primary : colors.onPrimary,
          fontSize: compact ? 15 : 17,
        }}
      >
        {label}
      </AppText>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  base: {
    minHeight: 48,
    borderRadius: radius.sm,
    paddingHorizontal: space.xl,
    flexDirection: 'row',
    gap: space.sm,
    alignItems: 'center',
    justifyContent: 'center',
    borderWidth: 2,
    borderColor: 'transparent',
  },
  compact: { minHeight: 40, paddingHorizontal: space.md },
  primary: { backgroundColor: colors.primary },
  secondary: { backgroundColor: colors.surface, borderColor: colors.primary },
  danger: { backgroundColor: colors.danger },
  off: { opacity: 0.55 },
});
