import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { colors, radius, space } from '../theme';
import { AppText } from './text';

/** A white panel on the paper background, with an optional heading. */
export function Card({
  title,
  children,
  testID,
  gap = 'md',
}: {
  title?: string;
  children: ReactNode;
  testID?: string;
  gap?: 'xs' | 'sm' | 'md' | 'lg';
}) {
  return (
    <View style={[styles.card, { gap: space[gap] }]} testID={testID}>
      {title ? <AppText variant="heading">{title}</AppText> : null}
      {children}
    </View>
  );
}

const styles = StyleSheet.create({
  card: {
    backgroundColor: colors.surface,
    borderColor: colors.line,
    borderWidth: 1,
    borderRadius: radius.md,
    padding: space.lg,
  },
});
