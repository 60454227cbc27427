import { StyleSheet, View } from 'react-native';
import { colors, radius, space } from '../theme';
import { AppText } from './text';

type Tone = 'error' | 'info' | 'success' | 'caution';

const palette: Record<Tone, { bg: string; border: string; text: 'danger' | 'ink' | 'ok' }> = {
  error: { bg: '#FDECEE', border: colors.danger, text: 'danger' },
  info: { bg: '#E8F1F3', border: colors.primary, text: 'ink' },
  success: { bg: '#E7F4EC', border: colors.ok, text: 'ok' },
  caution: { bg: colors.cautionBg, border: colors.caution, text: 'ink' },
};

/** A message across the top of a form or screen; errors are announced to screen readers. */
export function Banner({
  tone,
  message,
  testID,
}: {
  tone: Tone;
  message: string;
  testID?: string;
}) {
  const p = palette[tone];
  return (
    <View
      testID={testID}
      role={tone === 'error' ? 'alert' : 'status'}
      style={[styles.wrap, { backgroundColor: p.bg, borderLeftColor: p.border }]}
    >
      <AppText tone={p.text}>{message}</AppText>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { borderLeftWidth: 5, borderRadius: radius.sm, padding: space.md },
});
