import { forwardRef, useId } from 'react';
import { StyleSheet, TextInput, View, type TextInputProps } from 'react-native';
import { colors, fonts, radius, space } from '../theme';
import { AppText } from './text';

type Props = TextInputProps & { label: string; error?: string; hint?: string };

/** A labelled input with its error right under it. */
export const TextField = forwardRef<TextInput, Props>(function TextField(
  { label, error, hint, style, ...rest },
  ref,
) {
  const id = useId();
  return (
    <View style={styles.wrap}>
      <AppText variant="label" nativeID={`${id}-label`}>
        {label}
      </AppText>
      <TextInput
        ref={ref}
        aria-labelledby={`${id}-label`}
        aria-invalid={Boolean(error)}
        accessibilityLabel={label}
        placeholderTextColor={colors.muted}
        {...rest}
        style={[styles.input, error ? styles.inputError : null, style]}
      />
      {hint && !error ? (
        <AppText variant="small" tone="muted">
          {hint}
        </AppText>
      ) : null}
      {error ? (
        <AppText variant="small" tone="danger" role="alert">
          {error}
        </AppText>
      ) : null}
    </View>
  );
});

const styles = StyleSheet.create({
  wrap: { gap: space.xs },
  input: {
    minHeight: 48,
    borderWidth: 2,
    borderColor: colors.line,
    borderRadius: radius.sm,
    backgroundColor: colors.surface,
    paddingHorizontal: space.md,
    fontFamily: fonts.regular,
    fontSize: 17,
    color: colors.ink,
  },
  inputError: { borderColor: colors.danger },
});
