import { StyleSheet, View } from 'react-native';
import type { Section } from './sections';
import { colors, space } from './theme';
import { Card } from './ui/card';
import { AppText } from './ui/text';

/** A section's title, what it is for, and what it will hold: no sample data. */
export function SectionIntro({ section }: { section: Section }) {
  return (
    <View style={styles.wrap}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        {section.title}
      </AppText>
      <AppText testID="section-intro">{section.summary}</AppText>
      <Card gap="sm">
        <AppText variant="label" tone="muted">
          This section will hold
        </AppText>
        {section.holds.map((line) => (
          <View key={line} style={styles.item}>
            <View style={styles.bullet} />
            <AppText style={styles.itemText}>{line}</AppText>
          </View>
        ))}
      </Card>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.md },
  item: { flexDirection: 'row', gap: space.sm, alignItems: 'flex-start' },
  bullet: { width: 8, height: 8, borderRadius: 4, backgroundColor: colors.primary, marginTop: 8 },
  itemText: { flex: 1 },
});
