import { Pressable, StyleSheet, View } from 'react-native';
import { colors, radius, space } from './theme';
import { AppText } from './ui/text';

/** Shown by the root error boundary: what happened in plain words, and a way back. */
export function ErrorScreen({ error, onRetry }: { error: Error; onRetry: () => void }) {
  return (
    <View style={styles.wrap} accessibilityRole="alert">
      <AppText variant="title">Something went wrong</AppText>
      <AppText>
        This screen stopped working. Nothing you saved before is lost. Try again, and if it keeps
        happening, tell your lab manager what you were doing.
      </AppText>
      <AppText variant="small" tone="muted" testID="error-detail">
        {error.message}
      </AppText>
      <Pressable accessibilityRole="button" onPress={onRetry} style={styles.button}>
        <AppText variant="label" style={{ color: colors.onPrimary }}>
          Try again
        </AppText>
      </Pressable>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: {
    flex: 1,
    padding: space.xl,
    gap: space.lg,
    backgroundColor: colors.paper,
    justifyContent: 'center',
  },
  button: {
    alignSelf: 'flex-start',
    backgroundColor: colors.primary,
    borderRadius: radius.sm,
    paddingHorizontal: space.xl,
    minHeight: 48,
    justifyContent: 'center',
  },
});
