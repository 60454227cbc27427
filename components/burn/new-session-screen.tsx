import { router } from 'expo-router';
import { useState } from 'react';
import { View } from 'react-native';
import {
  draftLabels,
  drafts,
  igniterLabels,
  igniters,
  orientationLabels,
  orientations,
} from '../../shared/terms/burn';
import { fToC } from '../../shared/units';
import { ApiError } from '../api/client';
import { useCreateSessionMutation } from '../api/burn';
import { useCriteriaProfilesQuery } from '../api/rankings';
import { bannerMessage } from '../api/error-messages';
import { newClientId } from '../client-id';
import { useLab } from '../lab-context';
import { space } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { Choice } from '../ui/choice';
import { TextField } from '../ui/text-field';
import { AppText } from '../ui/text';
import { parseNumber, useUnitSystem } from '../units';
import { BenchCaution } from './bench-caution';

const opt = <T extends string>(values: readonly T[], labels: Record<T, string>) =>
  values.map((value) => ({ value, label: labels[value] }));

export function NewSessionScreen() {
  const { lab, can } = useLab();
  const units = useUnitSystem();
  const create = useCreateSessionMutation(lab.id);
  const [clientId] = useState(newClientId);
  const [place, setPlace] = useState('');
  const [secondPerson, setSecondPerson] = useState('');
  const [temp, setTemp] = useState('');
  const [rh, setRh] = useState('');
  const [draft, setDraft] = useState<(typeof drafts)[number]>('hood');
  const [wind, setWind] = useState('');
  const [igniter, setIgniter] = useState<(typeof igniters)[number]>('butane_lighter');
  const [igniterDetail, setIgniterDetail] = useState('');
  const [exposure, setExposure] = useState('12');
  const [orientation, setOrientation] = useState<(typeof orientations)[number]>('vertical');
  const profiles = useCriteriaProfilesQuery(lab.id);
  const [profileId, setProfileId] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [banner, setBanner] = useState<string>();
  if (!can('edit'))
    return <Banner tone="info" message="Only technicians and managers open burn sessions." />;

  const submit = async () => {
    setErrors({});
    setBanner(undefined);
    const t = parseNumber(temp);
    const tempC = t === undefined || Number.isNaN(t) ? t : units === 'us' ? fToC(t) : t;
    try {
      const session = await create.mutateAsync({
        clientId,
        heldAt: new Date().toISOString(),
        place,
        ...(secondPerson.trim() ? { secondPerson } : {}),
        ...(tempC !== undefined ? { ambientTempC: tempC } : {}),
        ...(parseNumber(rh) !== undefined ? { ambientRhPct: parseNumber(rh)! } : {}),
        draft,
        ...(wind.trim() ? { wind } : {}),
        igniter,
        ...(igniterDetail.trim() ? { igniterDetail } : {}),
        exposureS: parseNumber(exposure) ?? 12,
        orientation,
        ...(profileId ? { criteriaProfileId: profileId } : {}),
      });
      router.replace(`/labs/${lab.id}/burn-tests/sessions/${session.id}` as never);
    } catch (err) {
      if (err instanceof ApiError)
        setErrors(Object.fromEntries(err.fields.map((f) => [f.path, f.message])));
      setBanner(bannerMessage(err));
    }
  };

  return (
    <View style={{ gap: space.lg }}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        New burn session
      </AppText>
      <BenchCaution />
      {banner ? <Banner tone="error" message={banner} testID="form-banner" /> : null}
      <Card title="Where and who">
        <TextField
          label="Place"
          value={place}
          onChangeText={setPlace}
          testID="session-place"
          error={errors.place}
          hint="For example: paint shop, fume hood 2."
        />
        <TextField
          label="Second person present"
          value={secondPerson}
          onChangeText={setSecondPerson}
          testID="session-second-person"
        />
      </Card>
      <Card title="Conditions">
        <TextField
          label={`Air temperature (${units === 'us' ? '°F' : '°C'})`}
          value={temp}
          onChangeText={setTemp}
          inputMode="decimal"
          testID="session-temp"
          error={errors.ambientTempC}
        />
        <TextField
          label="Relative humidity (%)"
          value={rh}
          onChangeText={setRh}
          inputMode="decimal"
          testID="session-rh"
          error={errors.ambientRhPct}
        />
        <AppText variant="label">Draft</AppText>
        <Choice
          label="Draft"
          options={opt(drafts, draftLabels)}
          value={draft}
          onChange={setDraft}
          testID="session-draft"
        />
        {draft === 'open_air' ? (
          <TextField
            label="Wind (estimate)"
            value={wind}
            onChangeText={setWind}
            testID="session-wind"
          />
        ) : null}
        <AppText variant="label">Igniter</AppText>
        <Choice
          label="Igniter"
          options={opt(igniters, igniterLabels)}
          value={igniter}
          onChange={setIgniter}
          testID="session-igniter"
        />
        {igniter === 'other' ? (
          <TextField label="Which igniter" value={igniterDetail} onChangeText={setIgniterDetail} />
        ) : null}
        <TextField
          label="Flame exposure (seconds)"
          value={exposure}
          onChangeText={setExposure}
          inputMode="decimal"
          testID="session-exposure"
          error={errors.exposureS}
        />
        <AppText variant="label">Specimen orientation</AppText>
        <Choice
          label="Orientation"
          options={opt(orientations, orientationLabels)}
          value={orientation}
          onChange={setOrientation}
          testID="session-orientation"
        />
      </Card>
      {profiles.data?.profiles.length ? (
        <Card title="Judge against (optional)">
          <Choice
            label="Criteria profile"
            options={[
              { value: '', label: 'None' },
              ...profiles.data.profiles.map((p) => ({ value: p.id, label: p.name })),
            ]}
            value={profileId}
            onChange={setProfileId}
            testID="session-profile"
          />
        </Card>
      ) : null}
      <Button
        label="Open the session"
        onPress={() => void submit()}
        busy={create.isPending}
        testID="create-session"
      />
    </View>
  );
}
