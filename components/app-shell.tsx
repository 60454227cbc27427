import { Link, usePathname } from 'expo-router';
import type { ReactNode } from 'react';
import { Pressable, ScrollView, StyleSheet, useWindowDimensions, View } from 'react-native';
import { useSafeAreaInsets } from 'react-native-safe-area-context';
import { sections, type Section } from './sections';
import { colors, fonts, space, WIDE_BREAKPOINT } from './theme';
import { AppText } from './ui/text';

function isActive(section: Section, pathname: string): boolean {
  const href = String(section.href);
  return href === '/' ? pathname === '/' : pathname === href || pathname.startsWith(`${href}/`);
}

function NavItem({ section, wide }: { section: Section; wide: boolean }) {
  const pathname = usePathname();
  const active = isActive(section, pathname);
  return (
    <Link href={section.href} asChild>
      <Pressable
        testID={`nav-${section.key}`}
        aria-current={active ? 'page' : undefined}
        // Link's asChild merges props onto the DOM node, which cannot take a style array.
        style={StyleSheet.flatten([
          wide ? styles.sideItem : styles.tabItem,
          active && styles.itemActive,
        ])}
      >
        <AppText
          variant="label"
          numberOfLines={2}
          style={[
            wide ? styles.sideLabel : styles.tabLabel,
            { color: active ? colors.navActiveText : colors.navText },
          ]}
        >
          {section.title}
        </AppText>
      </Pressable>
    </Link>
  );
}

/** Phone first: bottom tabs on narrow windows, a side bar on wide ones. */
export function AppShell({ children }: { children: ReactNode }) {
  const { width } = useWindowDimensions();
  const insets = useSafeAreaInsets();
  const wide = width >= WIDE_BREAKPOINT;

  const content = (
    <ScrollView
      style={styles.content}
      contentContainerStyle={[styles.contentInner, wide && styles.contentInnerWide]}
    >
      {children}
    </ScrollView>
  );

  if (wide) {
    return (
      <View style={[styles.root, styles.row]}>
        <View style={[styles.side, { paddingTop: insets.top + space.xl }]} role="navigation">
          <AppText style={styles.wordmark} accessibilityRole="header">
            Quenchbook
          </AppText>
          {sections.map((s) => (
            <NavItem key={s.key} section={s} wide />
          ))}
        </View>
        {content}
      </View>
    );
  }

  return (
    <View style={[styles.root, { paddingTop: insets.top }]}>
      <View style={styles.topBar}>
        <AppText style={styles.wordmarkSmall}>Quenchbook</AppText>
      </View>
      {content}
      <View
        style={[styles.tabs, { paddingBottom: Math.max(insets.bottom, space.xs) }]}
        role="navigation"
      >
        {sections.map((s) => (
          <NavItem key={s.key} section={s} wide={false} />
        ))}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  root: { flex: 1, backgroundColor: colors.paper },
  row: { flexDirection: 'row' },
  side: {
    width: 228,
    backgroundColor: colors.navBg,
    paddingHorizontal: space.md,
    gap: space.xs,
  },
  wordmark: {
    fontFamily: fonts.bold,
    fontSize: 24,
    color: colors.navText,
    paddingHorizontal: space.md,
    marginBottom: space.xl,
  },
  sideItem: {
    minHeight: 48,
    borderRadius: 8,
    paddingHorizontal: space.md,
    justifyContent: 'center',
  },
  sideLabel: { fontSize: 18 },
  topBar: {
    backgroundColor: colors.navBg,
    paddingHorizontal: space.lg,
    paddingVertical: space.sm,
  },
  wordmarkSmall: { fontFamily: fonts.bold, fontSize: 19, color: colors.navText },
  tabs: {
    flexDirection: 'row',
    backgroundColor: colors.navBg,
    paddingTop: space.xs,
    paddingHorizontal: space.xs,
    gap: 2,
  },
  tabItem: {
    flex: 1,
    minHeight: 56,
    borderRadius: 8,
    alignItems: 'center',
    justifyContent: 'center',
    paddingHorizontal: 2,
  },
  tabLabel: { fontSize: 14, lineHeight: 17, textAlign: 'center' },
  itemActive: { backgroundColor: colors.navActiveBg },
  content: { flex: 1 },
  contentInner: { padding: space.lg, paddingBottom: space.xxl, gap: space.lg },
  contentInnerWide: { padding: space.xxl, maxWidth: 880, width: '100%' },
});
