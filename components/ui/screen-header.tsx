import { Link } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { colors, radius, space } from '../theme';
import { AppText } from './text';

/** A screen's title, with its main action as a button-like link beside it. */
export function ScreenHeader({
  title,
  action,
}: {
  title: string;
  action?: { href: string; label: string; testID: string };
}) {
  return (
    <View style={styles.head}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        {title}
      </AppText>
      {action ? (
        <Link href={action.href as never} testID={action.testID} style={styles.action}>
          <AppText variant="label" style={{ color: colors.onPrimary }}>
            {action.label}
          </AppText>
        </Link>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  head: {
    flexDirection: 'row',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.md,
    flexWrap: 'wrap',
  },
  action: {
    backgroundColor: colors.primary,
    paddingHorizontal: space.lg,
    paddingVertical: space.md,
    borderRadius: radius.sm,
  },
});
