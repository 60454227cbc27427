import { Link } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { colors, space } from './theme';
import { AppText } from './ui/text';

export function NotFoundScreen() {
  return (
    <View style={styles.wrap}>
      <AppText variant="title" accessibilityRole="header">
        No such page
      </AppText>
      <AppText>The link may be old or mistyped. Nothing has been changed.</AppText>
      <Link href="/" style={styles.link} testID="not-found-home">
        <AppText variant="label" style={{ color: colors.primary }}>
          Go to Today
        </AppText>
      </Link>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { flex: 1, padding: space.xl, gap: space.lg, backgroundColor: colors.paper },
  link: { paddingVertical: space.sm },
});
