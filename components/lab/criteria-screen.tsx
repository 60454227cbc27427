import { Link } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { ruleLabel } from '../../shared/criteria/judge';
import { ruleKinds, ruleNeedsLimit, type RuleKind } from '../../shared/terms/criteria';
import type { Rule } from '../../shared/criteria/types';
import type { CriteriaProfileOutput } from '../../shared/schemas/criteria';
import { schemaKit } from '../api/client';
import { bannerMessage } from '../api/error-messages';
import { useCriteriaMutations, useCriteriaProfilesQuery, usePresetsQuery } from '../api/rankings';
import { useLab } from '../lab-context';
import { colors, space } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { Choice } from '../ui/choice';
import { TextField } from '../ui/text-field';
import { AppText } from '../ui/text';
import { parseNumber } from '../units';

const kindLabels: Record<RuleKind, string> = {
  max_char_length_mm: 'Char length (mm)',
  max_afterflame_s: 'Afterflame (s)',
  max_afterglow_s: 'Afterglow (s)',
  no_flaming_drips: 'No flaming drips',
  max_mass_loss_pct: 'Mass loss (%)',
  max_burn_rate_mm_per_min: 'Burn rate (mm/min)',
  max_afterflame_plus_afterglow_s: 'Afterflame + afterglow (s)',
  no_burn_to_clamp: 'No burn to the clamp',
};

type RuleDraft = { kind: RuleKind; limit: string; appliesTo: 'each' | 'average' };

function Editor({
  profile,
  labId,
  onDone,
}: {
  profile: CriteriaProfileOutput;
  labId: string;
  onDone: () => void;
}) {
  const { save } = useCriteriaMutations(labId);
  const [name, setName] = useState(profile.name);
  const [min, setMin] = useState(String(profile.minSpecimens));
  const [rules, setRules] = useState<RuleDraft[]>(
    profile.rules.map((r) => ({
      kind: r.kind,
      limit: r.limit === undefined ? '' : String(r.limit),
      appliesTo: r.appliesTo,
    })),
  );
  const [problem, setProblem] = useState<string>();
  const submit = async () => {
    const candidate = {
      name,
      minSpecimens: parseNumber(min),
      rules: rules.map((r): Partial<Rule> => ({
        kind: r.kind,
        appliesTo: ruleNeedsLimit(r.kind) ? r.appliesTo : 'each',
        ...(ruleNeedsLimit(r.kind) ? { limit: parseNumber(r.limit) } : {}),
      })),
      ...(profile.source ? { source: profile.source } : {}),
      ...(profile.description ? { description: profile.description } : {}),
    };
    let kit;
    try {
      kit = await schemaKit();
    } catch (err) {
      setProblem(bannerMessage(err));
      return;
    }
    const parsed = kit.criteriaProfileSchema.safeParse(candidate);
    if (!parsed.success) {
      setProblem(parsed.error.issues.map((i) => `${i.path.join(' ')}: ${i.message}`).join('; '));
      return;
    }
    setProblem(undefined);
    save.mutate({ id: profile.id, input: parsed.data }, { onSuccess: onDone });
  };
  return (
    <View style={{ gap: space.sm }} testID="criteria-editor">
      <TextField label="Name" value={name} onChangeText={setName} testID="criteria-name" />
      <TextField
        label="Minimum number of specimens"
        value={min}
        onChangeText={setMin}
        inputMode="numeric"
        testID="criteria-min"
      />
      {rules.map((r, i) => (
        <View key={i} style={styles.rule}>
          <Choice
            label={`Rule ${i + 1}`}
            options={ruleKinds.map((k) => ({ value: k, label: kindLabels[k] }))}
            value={r.kind}
            onChange={(kind) =>
              setRules((all) => all.map((x, j) => (j === i ? { ...x, kind } : x)))
            }
          />
          {ruleNeedsLimit(r.kind) ? (
            <>
              <TextField
                label="At most"
                value={r.limit}
                onChangeText={(limit) =>
                  setRules((all) => all.map((x, j) => (j === i ? { ...x, limit } : x)))
                }
                inputMode="decimal"
                testID={`criteria-limit-${i}`}
              />
              <Choice
                label="Applies to"
                options={[
                  { value: 'each' as const, label: 'Each specimen' },
                  { value: 'average' as const, label: 'The average' },
                ]}
                value={r.appliesTo}
                onChange={(appliesTo) =>
                  setRules((all) => all.map((x, j) => (j === i ? { ...x, appliesTo } : x)))
                }
              />
            </>
          ) : null}
          <Button
            label="Remove rule"
            tone="secondary"
            compact
            onPress={() => setRules((all) => all.filter((_, j) => j !== i))}
          />
        </View>
      ))}
      <Button
        label="Add a rule"
        tone="secondary"
        compact
        onPress={() =>
          setRules((all) => [...all, { kind: 'max_char_length_mm', limit: '', appliesTo: 'each' }])
        }
      />
      {problem ? <Banner tone="error" message={problem} /> : null}
      {save.error ? <Banner tone="error" message={bannerMessage(save.error)} /> : null}
      <Button
        label="Save the profile"
        onPress={submit}
        busy={save.isPending}
        testID="criteria-save"
      />
    </View>
  );
}

/** The lab's pass rules: presets copied in, then edited by managers. */
export function CriteriaScreen() {
  const { lab, can } = useLab();
  const profiles = useCriteriaProfilesQuery(lab.id);
  const presets = usePresetsQuery(lab.id);
  const { copy, remove } = useCriteriaMutations(lab.id);
  const [editing, setEditing] = useState<string>();
  const manage = can('manage');
  return (
    <View style={{ gap: space.lg }}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        Criteria profiles
      </AppText>
      <AppText>
        The pass rules your lab judges burn tests against. Presets follow published test methods;
        copy one into the lab to adjust it. A bench test judged against them is not a certification:
        the Authority Having Jurisdiction decides.
      </AppText>
      <Link href={`/labs/${lab.id}/lab` as never}>
        <AppText variant="label" style={{ color: colors.primary }}>
          ← Back to the lab
        </AppText>
      </Link>
      {copy.error ? <Banner tone="error" message={bannerMessage(copy.error)} /> : null}
      {profiles.data?.profiles.length === 0 ? (
        <AppText tone="muted">No profiles of the lab's own yet.</AppText>
      ) : null}
      {profiles.data?.profiles.map((p) => (
        <Card key={p.id} title={p.name} testID={`criteria-${p.name}`}>
          {p.source ? <AppText tone="muted">{p.source}</AppText> : null}
          <AppText>
            At least {p.minSpecimens} specimen{p.minSpecimens === 1 ? '' : 's'}.
          </AppText>
          {p.rules.map((r, i) => (
            <AppText key={i}>• {ruleLabel(r)}</AppText>
          ))}
          {manage && editing === p.id ? (
            <Editor profile={p} labId={lab.id} onDone={() => setEditing(undefined)} />
          ) : null}
          {manage && editing !== p.id ? (
            <View style={styles.actions}>
              <Button
                label="Edit"
                tone="secondary"
                compact
                onPress={() => setEditing(p.id)}
                testID={`edit-criteria-${p.name}`}
              />
              <Button label="Delete" tone="secondary" compact onPress={() => remove.mutate(p.id)} />
            </View>
          ) : null}
        </Card>
      ))}
      {manage ? (
        <Card title="Copy a preset into the lab">
          {(presets.data?.presets ?? []).map((p) => (
            <View key={p.key} style={styles.preset}>
              <View style={{ flex: 1 }}>
                <AppText variant="label">{p.name}</AppText>
                {p.source ? (
                  <AppText variant="small" tone="muted">
                    {p.source}
                  </AppText>
                ) : null}
              </View>
              <Button
                label="Copy"
                compact
                onPress={() => copy.mutate(p.key)}
                busy={copy.isPending}
                testID={`copy-${p.key}`}
              />
            </View>
          ))}
        </Card>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  rule: {
    gap: space.xs,
    paddingBottom: space.sm,
    borderBottomWidth: 1,
    borderBottomColor: colors.line,
  },
  actions: { flexDirection: 'row', gap: space.sm },
  preset: { flexDirection: 'row', alignItems: 'center', gap: space.sm, paddingVertical: space.xs },
});
