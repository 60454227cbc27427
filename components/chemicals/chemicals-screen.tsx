import { Link } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { Chemical } from '../../shared/schemas/chemical';
import { bannerMessage } from '../api/error-messages';
import { useChemicalsQuery, useCreateChemicalMutation } from '../api/recipes';
import { useLab } from '../lab-context';
import { colors, fonts, radius, space } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { FormStack, FormTextField, useSubmit, useZodForm } from '../ui/form';
import { AppText } from '../ui/text';

/** Stable test handle for a chemical: the reference key when it has one, else its id. */
export function chemicalHandle(c: Chemical): string {
  return c.referenceKey ?? c.id;
}

export const confidenceWords: Record<NonNullable<Chemical['solubility']>['confidence'], string> = {
  confirmed: 'confirmed in the source',
  derived: 'derived from the source',
  memory: 'from memory, unconfirmed',
};

export const NO_SOLUBILITY = 'No solubility data: batches with it get no saturation check';

/** Reproductive-toxicity codes (H360…, the borates' H360FD) get the caution colours. */
function isSevere(code: string): boolean {
  return code.trim().toUpperCase().startsWith('H360');
}

export function HazardBadge({ code }: { code: string }) {
  const severe = isSevere(code);
  return (
    <View style={[styles.badge, severe && styles.badgeSevere]} testID={`hazard-${code}`}>
      <AppText variant="small" style={[styles.badgeText, severe && styles.badgeTextSevere]}>
        {code}
      </AppText>
    </View>
  );
}

export function OriginTag({ reference }: { reference: boolean }) {
  return (
    <View style={styles.origin}>
      <AppText variant="small" tone="muted">
        {reference ? 'Reference' : "This lab's own"}
      </AppText>
    </View>
  );
}

function ChemicalCard({ chemical, labId }: { chemical: Chemical; labId: string }) {
  const c = chemical;
  const facts = [
    c.formula,
    c.molarMass !== null ? `${c.molarMass.toFixed(2)} g/mol` : null,
    c.boronPercent !== null ? `Boron ${c.boronPercent.toFixed(2)} %` : null,
  ].filter((f): f is string => Boolean(f));
  return (
    <View style={styles.cardWrap}>
      <Card testID={`chemical-${chemicalHandle(c)}`} gap="sm">
        <View style={styles.cardHead}>
          <Link
            href={`/labs/${labId}/chemicals/${c.id}` as never}
            testID={`chemical-link-${chemicalHandle(c)}`}
            style={styles.nameLink}
          >
            <AppText variant="heading" style={styles.linkText}>
              {c.name}
            </AppText>
          </Link>
          <OriginTag reference={c.reference} />
        </View>
        {facts.length ? <AppText>{facts.join(' · ')}</AppText> : null}
        {c.hazards.length ? (
          <View style={styles.badges} aria-label="Hazard codes">
            {c.hazards.map((h) => (
              <HazardBadge key={h.code} code={h.code} />
            ))}
          </View>
        ) : null}
        <AppText variant="small" tone="muted" testID="solubility-summary">
          {c.solubility ? `Solubility: ${c.solubility.summary}` : NO_SOLUBILITY}
        </AppText>
      </Card>
    </View>
  );
}

// Form inputs arrive as text: blank means "not given", a decimal comma is accepted.
const emptyForm = {
  name: '',
  formula: '',
  molarMass: '',
  boronPercent: '',
  hazardCode: '',
  hazardText: '',
  solubilityLines: '',
  solubilitySource: '',
};

function AddChemicalForm({ labId }: { labId: string }) {
  const form = useZodForm((k) => k.addChemicalFormSchema, emptyForm);
  const create = useCreateChemicalMutation(labId);
  const [added, setAdded] = useState<string>();

  const { banner, submit } = useSubmit(form, async (values) => {
    setAdded(undefined);
    const chemical = await create.mutateAsync(values);
    setAdded(chemical.name);
    form.reset(emptyForm);
  });

  return (
    <FormStack banner={banner}>
      {added ? (
        <Banner
          tone="success"
          testID="chemical-added"
          message={`${added} is now in the library.`}
        />
      ) : null}
      <FormTextField control={form.control} name="name" label="Name" />
      <FormTextField
        control={form.control}
        name="formula"
        label="Formula (optional)"
        autoCapitalize="none"
        autoCorrect={false}
      />
      <FormTextField
        control={form.control}
        name="molarMass"
        label="Molar mass, g/mol (optional)"
        inputMode="decimal"
        keyboardType="decimal-pad"
      />
      <FormTextField
        control={form.control}
        name="boronPercent"
        label="Boron, % by mass (optional)"
        inputMode="decimal"
        keyboardType="decimal-pad"
        hint="Only for chemicals that contain boron; it counts toward a batch's boron content."
      />
      <FormTextField
        control={form.control}
        name="hazardCode"
        label="Hazard code (optional)"
        autoCapitalize="characters"
        autoCorrect={false}
        hint="For example H319. Give the code and its text together."
      />
      <FormTextField
        control={form.control}
        name="hazardText"
        label="Hazard text (optional)"
        hint="In plain words, as on the label or safety data sheet."
      />
      <FormTextField
        control={form.control}
        name="solubilityLines"
        label="Solubility, g per 100 g water (optional)"
        multiline
        hint="One line per temperature in °C, rising: the temperature, then the value, e.g. 20 4.87. Without data, batches with this chemical get no saturation check."
      />
      <FormTextField
        control={form.control}
        name="solubilitySource"
        label="Source of the solubility data"
        hint="Handbook, data sheet or paper, with the page or table."
      />
      <Button
        label="Add to the library"
        onPress={submit}
        busy={create.isPending}
        testID="add-chemical-submit"
      />
    </FormStack>
  );
}

export function ChemicalsScreen() {
  const { lab, can } = useLab();
  const chemicals = useChemicalsQuery(lab.id);
  const list = chemicals.data?.chemicals ?? [];
  const own = list.filter((c) => !c.reference).length;

  return (
    <View style={styles.screen}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        Chemicals
      </AppText>
      <AppText>
        The salts your recipes can use: the reference chemicals every lab shares, and{' '}
        {ownWords(own)} of {lab.name}'s own. Open one for its hazards and solubility table.
      </AppText>
      {chemicals.error ? (
        <Banner tone="error" message={bannerMessage(chemicals.error)} testID="chemicals-error" />
      ) : null}
      {chemicals.isPending ? <AppText tone="muted">Loading the library…</AppText> : null}
      <View style={styles.grid} testID="chemicals-list">
        {list.map((c) => (
          <ChemicalCard key={c.id} chemical={c} labId={lab.id} />
        ))}
      </View>
      {chemicals.data && list.length === 0 ? (
        <AppText tone="muted">The library is empty.</AppText>
      ) : null}
      {can('edit') ? (
        <Card testID="add-chemical" gap="lg">
          <AppText variant="heading" accessibilityRole="header" aria-level={2}>
            Add a chemical of your own
          </AppText>
          <AppText>
            Only {lab.name} sees it. Name it plainly, so everyone in the lab knows which product it
            is.
          </AppText>
          <AddChemicalForm labId={lab.id} />
        </Card>
      ) : null}
    </View>
  );
}

function ownWords(count: number): string {
  if (count === 0) return 'no chemicals';
  return count === 1 ? 'one chemical' : `${count} chemicals`;
}

const styles = StyleSheet.create({
  screen: { gap: space.lg },
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cardWrap: { flexGrow: 1, flexBasis: 340, maxWidth: '100%' },
  cardHead: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.sm,
  },
  nameLink: { flexShrink: 1 },
  linkText: { color: colors.primary, textDecorationLine: 'underline' },
  badges: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xs },
  badge: {
    borderWidth: 1,
    borderColor: colors.line,
    borderRadius: radius.sm,
    paddingHorizontal: space.sm,
    paddingVertical: 2,
    backgroundColor: colors.surface,
  },
  badgeSevere: { borderColor: colors.caution, backgroundColor: colors.cautionBg },
  badgeText: { fontSize: 13, lineHeight: 18 },
  badgeTextSevere: { color: colors.caution, fontFamily: fonts.bold },
  origin: {
    borderRadius: radius.sm,
    backgroundColor: colors.paper,
    paddingHorizontal: space.sm,
    paddingVertical: 2,
  },
});
