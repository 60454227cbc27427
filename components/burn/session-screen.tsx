import { Link } from 'expo-router';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import {
  checklistItems,
  draftLabels,
  igniterLabels,
  orientationLabels,
  statusLabels,
} from '../../shared/terms/burn';
import { ApiError } from '../api/client';
import {
  useCreatePairMutation,
  useSessionQuery,
  useUnburnedQuery,
  useUpdateSessionMutation,
} from '../api/burn';
import { bannerMessage } from '../api/error-messages';
import { newClientId } from '../client-id';
import { Loading } from '../lab-gate';
import { useLab } from '../lab-context';
import { colors, space } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { Choice } from '../ui/choice';
import { TextField } from '../ui/text-field';
import { AppText } from '../ui/text';
import { formatTemperature, formatWhen, parseNumber, round, useUnitSystem } from '../units';
import { BenchCaution } from './bench-caution';

function AddPair({ labId, sessionId }: { labId: string; sessionId: string }) {
  const unburned = useUnburnedQuery(labId);
  const create = useCreatePairMutation(labId, sessionId);
  const [treated, setTreated] = useState('');
  const [code, setCode] = useState('');
  const [mass, setMass] = useState('');
  const [conditioning, setConditioning] = useState('');
  const [mode, setMode] = useState<'simultaneous' | 'sequential'>('simultaneous');
  const [ids, setIds] = useState(() => ({ pair: newClientId(), control: newClientId() }));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [banner, setBanner] = useState<string>();
  const chosen = unburned.data?.specimens.find((s) => s.id === treated);
  const submit = async () => {
    setErrors({});
    setBanner(undefined);
    try {
      await create.mutateAsync({
        clientId: ids.pair,
        treatedSpecimenId: treated,
        control: {
          clientId: ids.control,
          code,
          substrate: chosen?.substrate ?? 'untreated',
          ...(chosen?.lengthMm ? { lengthMm: chosen.lengthMm } : {}),
          ...(chosen?.widthMm ? { widthMm: chosen.widthMm } : {}),
          dryMassG: parseNumber(mass) ?? 0,
          ...(conditioning.trim() ? { conditioning } : {}),
        },
        mode,
      });
      setTreated('');
      setCode('');
      setMass('');
      setIds({ pair: newClientId(), control: newClientId() });
    } catch (err) {
      if (err instanceof ApiError)
        setErrors(Object.fromEntries(err.fields.map((f) => [f.path, f.message])));
      setBanner(bannerMessage(err));
    }
  };
  return (
    <Card title="Add a pair" testID="add-pair">
      {banner ? <Banner tone="error" message={banner} /> : null}
      <AppText variant="label">Treated specimen (from a batch's log)</AppText>
      {unburned.data && !unburned.data.specimens.length ? (
        <AppText tone="muted">
          No treated specimen is waiting: log specimens on a batch first.
        </AppText>
      ) : (
        <Choice
          label="Treated specimen"
          options={(unburned.data?.specimens ?? []).map((s) => ({
            value: s.id,
            label: `${s.code} · ${s.recipeName}${s.addOnPct !== null ? ` · add-on ${round(s.addOnPct, 1)} %` : ''}`,
          }))}
          value={treated}
          onChange={setTreated}
          testID="pair-treated"
        />
      )}
      {errors.treatedSpecimenId ? (
        <AppText tone="danger">{errors.treatedSpecimenId}</AppText>
      ) : null}
      <TextField
        label="Control specimen code (untreated)"
        value={code}
        onChangeText={setCode}
        autoCapitalize="characters"
        testID="pair-control-code"
        error={errors['control.code']}
      />
      <TextField
        label="Control dry mass (g)"
        value={mass}
        onChangeText={setMass}
        inputMode="decimal"
        testID="pair-control-mass"
        error={errors['control.dryMassG']}
      />
      <TextField
        label="Conditioning of the control (optional)"
        value={conditioning}
        onChangeText={setConditioning}
        hint="Conditioned like the treated specimen, e.g. 24 h at 21 °C, 65 % RH."
      />
      <Choice
        label="How they burn"
        options={[
          { value: 'simultaneous' as const, label: 'Side by side, at the same moment' },
          { value: 'sequential' as const, label: 'One after the other' },
        ]}
        value={mode}
        onChange={setMode}
        testID="pair-mode"
      />
      <Button
        label="Add the pair"
        onPress={() => void submit()}
        busy={create.isPending}
        disabled={!treated}
        testID="create-pair"
      />
    </Card>
  );
}

export function SessionScreen({ sessionId }: { sessionId: string }) {
  const { lab, can } = useLab();
  const units = useUnitSystem();
  const session = useSessionQuery(lab.id, sessionId);
  const update = useUpdateSessionMutation(lab.id, sessionId);
  if (session.isPending) return <Loading />;
  const s = session.data;
  if (!s) return <Banner tone="error" message={bannerMessage(session.error)} />;
  const edit = can('edit');
  return (
    <View style={{ gap: space.lg }}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        Session · {s.place}
      </AppText>
      <AppText tone="muted">
        {formatWhen(s.heldAt)} · {s.operator ?? 'unknown operator'}
        {s.secondPerson ? ` with ${s.secondPerson}` : ''} · {draftLabels[s.draft]}
        {s.wind ? ` (${s.wind})` : ''} · {igniterLabels[s.igniter]} · {s.exposureS} s flame ·{' '}
        {orientationLabels[s.orientation]}
        {s.ambientTempC !== null ? ` · ${formatTemperature(s.ambientTempC, units)}` : ''}
        {s.ambientRhPct !== null ? ` · ${round(s.ambientRhPct, 0)} % RH` : ''}
      </AppText>
      {s.criteriaProfile ? (
        <AppText testID="session-profile">Judged against: {s.criteriaProfile.name}</AppText>
      ) : null}
      <BenchCaution />
      <Card title="Before the first flame" testID="checklist">
        {update.error ? <Banner tone="error" message={bannerMessage(update.error)} /> : null}
        {checklistItems.map((item) => {
          const on = s.checklist[item.key] === true;
          return (
            <Pressable
              key={item.key}
              role="checkbox"
              aria-checked={on}
              disabled={!edit || update.isPending}
              testID={`check-${item.key}`}
              onPress={() => update.mutate({ checklist: { [item.key]: !on } })}
              style={styles.check}
            >
              <View style={[styles.box, on && styles.boxOn]}>
                {on ? <AppText style={{ color: colors.onPrimary }}>✓</AppText> : null}
              </View>
              <AppText style={{ flex: 1 }}>{item.label}</AppText>
            </Pressable>
          );
        })}
        <AppText
          variant="label"
          tone={s.checklistCompletedAt ? 'ok' : 'danger'}
          testID="checklist-state"
        >
          {s.checklistCompletedAt
            ? `All checked ${formatWhen(s.checklistCompletedAt)}: timers may start.`
            : 'Tick every item before the first timer starts.'}
        </AppText>
      </Card>
      <Card title="Pairs">
        {!s.pairs.length ? <AppText tone="muted">No pairs yet.</AppText> : null}
        {s.pairs.map((p) => (
          <View key={p.id} style={styles.pair}>
            <AppText variant="label">
              {p.controlCode} (control) · {p.treatedCode} (treated)
              {p.recipeName ? ` · ${p.recipeName}` : ''}
            </AppText>
            <AppText tone="muted">{statusLabels[p.status]}</AppText>
            <View style={styles.links}>
              <Link
                href={`/labs/${lab.id}/burn-tests/pairs/${p.id}/timer` as never}
                testID={`timer-${p.treatedCode}`}
              >
                <AppText variant="label" style={{ color: colors.primary }}>
                  Timer
                </AppText>
              </Link>
              <Link
                href={`/labs/${lab.id}/burn-tests/pairs/${p.id}` as never}
                testID={`pair-${p.treatedCode}`}
              >
                <AppText variant="label" style={{ color: colors.primary }}>
                  Results and review
                </AppText>
              </Link>
            </View>
          </View>
        ))}
      </Card>
      {edit ? <AddPair labId={lab.id} sessionId={s.id} /> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  check: { flexDirection: 'row', alignItems: 'center', gap: space.md, minHeight: 48 },
  box: {
    width: 28,
    height: 28,
    borderWidth: 2,
    borderColor: colors.ink,
    borderRadius: 4,
    alignItems: 'center',
    justifyContent: 'center',
  },
  boxOn: { backgroundColor: colors.primary, borderColor: colors.primary },
  pair: { gap: 2, paddingBottom: space.sm, borderBottomWidth: 1, borderBottomColor: colors.line },
  links: { flexDirection: 'row', gap: space.lg },
});
