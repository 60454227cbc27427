import { router, usePathname } from 'expo-router';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { useLab } from './lab-context';
import { colors, radius, space } from './theme';
import { AppText } from './ui/text';

const roleWord = {
  manager: 'Manager',
  technician: 'Technician',
  reviewer: 'Reviewer',
  viewer: 'Viewer',
};

/** The current lab and your role in it; opens a list of your other labs. */
export function LabSwitcher({ compact }: { compact?: boolean }) {
  const { lab, me } = useLab();
  const pathname = usePathname();
  const [open, setOpen] = useState(false);
  const others = me.labs.filter((l) => l.id !== lab.id);

  const go = (labId: string) => {
    setOpen(false);
    // Stay in the same section of the other lab.
    const rest = pathname
      .replace(/^\/labs\/[^/]+/, '')
      .split('/')
      .slice(0, 2)
      .join('/');
    router.push(`/labs/${labId}${rest}` as never);
  };

  return (
    <View>
      <Pressable
        accessibilityRole="button"
        aria-expanded={open}
        // Named by what it shows (lab, role, "switch"), so speech control finds it by its words.
        testID="lab-switcher"
        onPress={() => setOpen((v) => !v)}
        style={[styles.current, compact && styles.currentCompact]}
      >
        <AppText variant="label" numberOfLines={1} style={styles.labName}>
          {lab.name}
        </AppText>
        <AppText variant="small" style={styles.role} testID="current-role">
          {roleWord[lab.role]}
          {others.length ? ' · switch' : ''}
        </AppText>
      </Pressable>
      {open ? (
        <View style={styles.menu} role="menu">
          {others.length === 0 ? (
            <AppText variant="small" tone="muted">
              You belong to no other lab.
            </AppText>
          ) : (
            others.map((l) => (
              <Pressable
                key={l.id}
                role="menuitem"
                testID={`switch-to-${l.id}`}
                onPress={() => go(l.id)}
                style={styles.item}
              >
                <AppText variant="label">{l.name}</AppText>
                <AppText variant="small" tone="muted">
                  {roleWord[l.role]}
                </AppText>
              </Pressable>
            ))
          )}
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  current: {
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    borderRadius: radius.sm,
    backgroundColor: '#1E2D3A',
  },
  currentCompact: { paddingVertical: 4, maxWidth: 220 },
  labName: { color: colors.navText },
  role: { color: '#B8C2CA' },
  menu: {
    marginTop: space.xs,
    backgroundColor: colors.surface,
    borderRadius: radius.sm,
    padding: space.sm,
    gap: space.xs,
    borderWidth: 1,
    borderColor: colors.line,
  },
  item: {
    paddingVertical: space.sm,
    paddingHorizontal: space.sm,
    borderRadius: radius.sm,
    minHeight: 44,
  },
});
