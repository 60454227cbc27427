import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { Batch } from '../../shared/schemas/batch';
import { ApiError } from '../api/client';
import { useAddSpecimenMutation, useUpdateSpecimenMutation } from '../api/batches';
import { bannerMessage } from '../api/error-messages';
import { newClientId } from '../client-id';
import { colors, space } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { TextField } from '../ui/text-field';
import { AppText } from '../ui/text';
import {
  formatLength,
  formatMass,
  gramsFromText,
  millimetresFromText,
  round,
  useUnitSystem,
} from '../units';

const empty = { code: '', lengthMm: '', widthMm: '', dryBefore: '', wet: '', dryAfter: '' };

/** Specimens treated in this batch: masses before and after, add-on and pick-up. */
export function SpecimenLog({
  batch,
  labId,
  substrate,
  canEdit,
}: {
  batch: Batch;
  labId: string;
  substrate: string;
  canEdit: boolean;
}) {
  const units = useUnitSystem();
  const add = useAddSpecimenMutation(labId, batch.id);
  const update = useUpdateSpecimenMutation(labId, batch.id);
  const [form, setForm] = useState(empty);
  const [clientId, setClientId] = useState(newClientId);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [banner, setBanner] = useState<string>();
  const [later, setLater] = useState<Record<string, string>>({});
  const massUnit = units === 'us' ? 'oz' : 'g';
  const toG = (t: string) => gramsFromText(t, units);
  const toMm = (t: string) => millimetresFromText(t, units);
  const set = (key: keyof typeof empty) => (value: string) =>
    setForm((f) => ({ ...f, [key]: value }));

  const submit = async () => {
    setBanner(undefined);
    setErrors({});
    try {
      await add.mutateAsync({
        clientId,
        code: form.code,
        substrate,
        ...(toMm(form.lengthMm) !== undefined ? { lengthMm: toMm(form.lengthMm)! } : {}),
        ...(toMm(form.widthMm) !== undefined ? { widthMm: toMm(form.widthMm)! } : {}),
        dryMassBeforeG: toG(form.dryBefore) ?? 0,
        ...(toG(form.wet) !== undefined ? { wetMassG: toG(form.wet)! } : {}),
        ...(toG(form.dryAfter) !== undefined ? { dryMassAfterG: toG(form.dryAfter)! } : {}),
      });
      setForm(empty);
      setClientId(newClientId());
    } catch (err) {
      if (err instanceof ApiError)
        setErrors(Object.fromEntries(err.fields.map((f) => [f.path, f.message])));
      setBanner(bannerMessage(err));
    }
  };

  return (
    <View style={styles.wrap} testID="specimen-log">
      {batch.specimens.length === 0 ? (
        <AppText tone="muted">No specimens logged yet.</AppText>
      ) : null}
      {batch.specimens.map((s) => (
        <View key={s.id} style={styles.row} testID={`specimen-${s.code}`}>
          <AppText variant="label">
            {s.code} · {s.substrate}
            {s.lengthMm
              ? ` · ${formatLength(s.lengthMm, units)} × ${formatLength(s.widthMm, units)}`
              : ''}
          </AppText>
          <AppText>
            Dry before {formatMass(s.dryMassBeforeG, units)} · wet{' '}
            {s.wetMassG === null ? '–' : formatMass(s.wetMassG, units)} · dry after{' '}
            {s.dryMassAfterG === null ? '–' : formatMass(s.dryMassAfterG, units)}
          </AppText>
          <AppText variant="label" testID={`addon-${s.code}`}>
            Add-on {s.addOnPct === null ? 'not yet (weigh when dry)' : `${round(s.addOnPct, 2)} %`}{' '}
            · pick-up {s.pickUpPct === null ? '–' : `${round(s.pickUpPct, 1)} %`}
          </AppText>
          {s.dryMassAfterG === null && canEdit ? (
            <View style={styles.inline}>
              <View style={{ flex: 1 }}>
                <TextField
                  label={`Dry mass after drying (${massUnit})`}
                  value={later[s.id] ?? ''}
                  onChangeText={(t) => setLater((l) => ({ ...l, [s.id]: t }))}
                  inputMode="decimal"
                />
              </View>
              <Button
                label="Save"
                compact
                onPress={() => {
                  const g = toG(later[s.id] ?? '');
                  if (g && g > 0) update.mutate({ specimenId: s.id, dryMassAfterG: g });
                }}
              />
            </View>
          ) : null}
        </View>
      ))}
      {canEdit ? (
        <View style={styles.form} testID="specimen-form">
          <AppText variant="label">Log a specimen</AppText>
          {banner ? <Banner tone="error" message={banner} /> : null}
          <TextField
            label="Specimen code"
            value={form.code}
            onChangeText={set('code')}
            autoCapitalize="characters"
            testID="specimen-code"
            error={errors.code}
          />
          <View style={styles.inline}>
            <View style={{ flex: 1 }}>
              <TextField
                label={`Length (${units === 'us' ? 'in' : 'mm'})`}
                value={form.lengthMm}
                onChangeText={set('lengthMm')}
                inputMode="decimal"
                testID="specimen-length"
                error={errors.lengthMm}
              />
            </View>
            <View style={{ flex: 1 }}>
              <TextField
                label={`Width (${units === 'us' ? 'in' : 'mm'})`}
                value={form.widthMm}
                onChangeText={set('widthMm')}
                inputMode="decimal"
                testID="specimen-width"
                error={errors.widthMm}
              />
            </View>
          </View>
          <TextField
            label={`Dry mass before treatment (${massUnit})`}
            value={form.dryBefore}
            onChangeText={set('dryBefore')}
            inputMode="decimal"
            testID="specimen-dry-before"
            error={errors.dryMassBeforeG}
          />
          <TextField
            label={`Wet mass after soaking (${massUnit}, optional)`}
            value={form.wet}
            onChangeText={set('wet')}
            inputMode="decimal"
            testID="specimen-wet"
            error={errors.wetMassG}
          />
          <TextField
            label={`Dry mass after drying (${massUnit}, optional now)`}
            value={form.dryAfter}
            onChangeText={set('dryAfter')}
            inputMode="decimal"
            testID="specimen-dry-after"
            error={errors.dryMassAfterG}
          />
          <Button
            label="Log specimen"
            onPress={() => void submit()}
            busy={add.isPending}
            testID="log-specimen"
          />
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.md },
  row: { gap: 2, paddingBottom: space.sm, borderBottomWidth: 1, borderBottomColor: colors.line },
  form: { gap: space.md, paddingTop: space.sm },
  inline: { flexDirection: 'row', gap: space.sm, alignItems: 'flex-end' },
});
