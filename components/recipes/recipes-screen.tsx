import { Link } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { substrateLabels, substrates, type Substrate } from '../../shared/terms/recipe';
import { bannerMessage } from '../api/error-messages';
import { useRecipesQuery } from '../api/recipes';
import { useLab } from '../lab-context';
import { colors, space } from '../theme';
import { Banner } from '../ui/banner';
import { Card } from '../ui/card';
import { ScreenHeader } from '../ui/screen-header';
import { Choice } from '../ui/choice';
import { TextField } from '../ui/text-field';
import { AppText } from '../ui/text';
import { formatDuration, formatTemperature, round, useUnitSystem } from '../units';

const filterOptions = [
  { value: '' as const, label: 'All' },
  ...substrates.map((s) => ({ value: s, label: substrateLabels[s] })),
];

export function RecipesScreen() {
  const { lab, can } = useLab();
  const units = useUnitSystem();
  const [q, setQ] = useState('');
  const [substrate, setSubstrate] = useState<Substrate | ''>('');
  const recipes = useRecipesQuery(lab.id, q, substrate);
  const list = recipes.data?.recipes ?? [];

  return (
    <View style={styles.screen}>
      <ScreenHeader
        title="Recipes"
        action={
          can('edit')
            ? { href: `/labs/${lab.id}/recipes/new`, label: 'New recipe', testID: 'new-recipe' }
            : undefined
        }
      />
      <AppText>
        Soak recipes: what to dissolve, how much, and how to soak, drain, dry and condition.
      </AppText>
      <TextField
        label="Search by name"
        value={q}
        onChangeText={setQ}
        testID="recipe-search"
        autoCapitalize="none"
      />
      <Choice
        label="Substrate"
        options={filterOptions}
        value={substrate}
        onChange={setSubstrate}
        testID="substrate-filter"
      />
      <Link href={`/labs/${lab.id}/chemicals` as never} testID="link-chemicals">
        <AppText variant="label" style={{ color: colors.primary }}>
          Chemicals library: hazards and solubility data
        </AppText>
      </Link>
      {recipes.error ? <Banner tone="error" message={bannerMessage(recipes.error)} /> : null}
      {recipes.isSuccess && list.length === 0 ? (
        <AppText tone="muted">{q || substrate ? 'No recipe matches.' : 'No recipes yet.'}</AppText>
      ) : null}
      {list.map((r) => (
        <Link
          key={r.id}
          href={`/labs/${lab.id}/recipes/${r.id}` as never}
          testID={`recipe-${r.name}`}
        >
          <Card>
            <AppText variant="heading">{r.name}</AppText>
            <AppText tone="muted">
              {substrateLabels[r.substrate]} · revision {r.current.number}
              {r.current.batchCount
                ? ` · used by ${r.current.batchCount} batch${r.current.batchCount === 1 ? '' : 'es'}`
                : ''}
            </AppText>
            <AppText>
              {r.current.ingredients
                .map((i) => `${i.chemicalName} ${round(i.gPer100gWater, 2)} g/100 g water`)
                .join(' + ')}
            </AppText>
            <AppText variant="small" tone="muted">
              Mix at {formatTemperature(r.current.mixingTempC, units)} · soak{' '}
              {formatDuration(r.current.soakMinutes)}
            </AppText>
          </Card>
        </Link>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  screen: { gap: space.lg },
});
