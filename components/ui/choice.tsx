import { Pressable, StyleSheet, View } from 'react-native';
import { colors, radius, space } from '../theme';
import { AppText } from './text';

type Props<T extends string> = {
  label: string;
  options: readonly { value: T; label: string }[];
  value: T;
  onChange: (value: T) => void;
  disabled?: boolean;
  testID?: string;
};

/** One of a few options, as a row of buttons (a radio group to assistive technology). */
export function Choice<T extends string>({
  label,
  options,
  value,
  onChange,
  disabled,
  testID,
}: Props<T>) {
  return (
    <View style={styles.wrap} role="radiogroup" aria-label={label} testID={testID}>
      {options.map((o) => {
        const on = o.value === value;
        return (
          <Pressable
            key={o.value}
            role="radio"
            aria-checked={on}
            aria-label={o.label}
            disabled={disabled}
            testID={testID ? `${testID}-${o.value}` : undefined}
            onPress={() => onChange(o.value)}
            style={[styles.option, on && styles.on, disabled && styles.off]}
          >
            <AppText variant="label" style={{ color: on ? colors.onPrimary : colors.ink }}>
              {o.label}
            </AppText>
          </Pressable>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xs },
  option: {
    minHeight: 40,
    paddingHorizontal: space.md,
    borderRadius: radius.sm,
    borderWidth: 2,
    borderColor: colors.line,
    backgroundColor: colors.surface,
    justifyContent: 'center',
  },
  on: { backgroundColor: colors.primary, borderColor: colors.primary },
  off: { opacity: 0.55 },
});
