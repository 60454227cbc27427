import { Link, type Href } from 'expo-router';
import type { ReactNode } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';
import { usePreloadOnceShown } from '../preload';
import { colors, fonts, radius, space } from '../theme';
import { AppText } from '../ui/text';

/** The plain frame of the screens outside a lab: sign-in, sign-up, reset, invitation. */
export function AuthFrame({
  title,
  intro,
  children,
}: {
  title: string;
  intro?: string;
  children: ReactNode;
}) {
  usePreloadOnceShown();
  return (
    <ScrollView style={styles.page} contentContainerStyle={styles.center}>
      <View style={styles.card}>
        <AppText style={styles.wordmark}>Quenchbook</AppText>
        <AppText variant="title" accessibilityRole="header" aria-level={1} testID="screen-title">
          {title}
        </AppText>
        {intro ? (
          <AppText tone="muted" testID="screen-intro">
            {intro}
          </AppText>
        ) : null}
        {children}
      </View>
    </ScrollView>
  );
}

export function FrameLink({ href, label, testID }: { href: Href; label: string; testID?: string }) {
  return (
    <Link href={href} testID={testID} style={styles.link}>
      <AppText variant="label" style={{ color: colors.primary }}>
        {label}
      </AppText>
    </Link>
  );
}

const styles = StyleSheet.create({
  page: { flex: 1, backgroundColor: colors.navBg },
  center: { flexGrow: 1, justifyContent: 'center', alignItems: 'center', padding: space.lg },
  card: {
    width: '100%',
    maxWidth: 460,
    backgroundColor: colors.paper,
    borderRadius: radius.md,
    padding: space.xl,
    gap: space.lg,
  },
  wordmark: { fontFamily: fonts.bold, fontSize: 20, color: colors.primary },
  link: { paddingVertical: space.xs },
});
