import { Link, usePathname } from 'expo-router';
import type { ReactNode } from 'react';
import { Pressable, ScrollView, StyleSheet, useWindowDimensions, View } from 'react-native';
import { useSafeAreaInsets } from 'react-native-safe-area-context';
import { useLab } from './lab-context';
import { LabSwitcher } from './lab-switcher';
import { usePreloadOnceShown } from './preload';
import { sectionPath, sections, type Section } from './sections';
import { colors, fonts, space, WIDE_BREAKPOINT } from './theme';
import { printExpand, printHide } from './ui/print';
import { AppText } from './ui/text';

type NavTarget = { key: string; title: string; path: string; exact: boolean };

function isActive(target: NavTarget, pathname: string): boolean {
  return target.exact
    ? pathname === target.path
    : pathname === target.path || pathname.startsWith(`${target.path}/`);
}

function NavItem({ target, wide }: { target: NavTarget; wide: boolean }) {
  const pathname = usePathname();
  const active = isActive(target, pathname);
  return (
    <Link href={target.path as never} asChild>
      <Pressable
        testID={`nav-${target.key}`}
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
          {target.title}
        </AppText>
      </Pressable>
    </Link>
  );
}

const toTarget =
  (labId: string) =>
  (s: Section): NavTarget => ({
    key: s.key,
    title: s.title,
    path: sectionPath(labId, s),
    exact: s.segment === '',
  });

/** Phone first: bottom tabs on narrow windows, a side bar on wide ones. */
export function AppShell({ children }: { children: ReactNode }) {
  const { width } = useWindowDimensions();
  const insets = useSafeAreaInsets();
  usePreloadOnceShown();
  const { lab } = useLab();
  const wide = width >= WIDE_BREAKPOINT;
  const targets = sections.map(toTarget(lab.id));
  const account: NavTarget = {
    key: 'account',
    title: 'Account',
    path: `/labs/${lab.id}/account`,
    exact: true,
  };

  const content = (
    <ScrollView
      {...printExpand}
      style={styles.content}
      contentContainerStyle={[styles.contentInner, wide && styles.contentInnerWide]}
    >
      {children}
    </ScrollView>
  );

  if (wide) {
    return (
      <View style={[styles.root, styles.row]}>
        <View
          style={[styles.side, { paddingTop: insets.top + space.xl }]}
          role="navigation"
          {...printHide}
        >
          <AppText style={styles.wordmark} accessibilityRole="header">
            Quenchbook
          </AppText>
          <LabSwitcher />
          <View style={styles.sideList}>
            {targets.map((t) => (
              <NavItem key={t.key} target={t} wide />
            ))}
          </View>
          <View style={styles.sideBottom}>
            <NavItem target={account} wide />
          </View>
        </View>
        {content}
      </View>
    );
  }

  return (
    <View style={[styles.root, { paddingTop: insets.top }]}>
      <View style={styles.topBar} {...printHide}>
        <View style={styles.topLeft}>
          <LabSwitcher compact />
        </View>
        <Link href={account.path as never} testID="nav-account" style={styles.accountLink}>
          <AppText variant="label" style={{ color: colors.navText }}>
            Account
          </AppText>
        </Link>
      </View>
      {content}
      <View
        style={[styles.tabs, { paddingBottom: Math.max(insets.bottom, space.xs) }]}
        role="navigation"
      >
        {targets.map((t) => (
          <NavItem key={t.key} target={t} wide={false} />
        ))}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  root: { flex: 1, backgroundColor: colors.paper },
  row: { flexDirection: 'row' },
  side: {
    width: 236,
    backgroundColor: colors.navBg,
    paddingHorizontal: space.md,
    paddingBottom: space.lg,
    gap: space.lg,
  },
  sideList: { gap: space.xs },
  sideBottom: { marginTop: 'auto' },
  wordmark: {
    fontFamily: fonts.bold,
    fontSize: 24,
    color: colors.navText,
    paddingHorizontal: space.md,
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
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    flexDirection: 'row',
    alignItems: 'flex-start',
    justifyContent: 'space-between',
    gap: space.md,
  },
  topLeft: { flexShrink: 1 },
  accountLink: { paddingVertical: space.sm, paddingHorizontal: space.xs },
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
  contentInnerWide: { padding: space.xxl, maxWidth: 920, width: '100%' },
});
