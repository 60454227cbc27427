import { Link } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { substrateLabels } from '../../shared/terms/recipe';
import { useBatchQuery, useUpdateBatchMutation } from '../api/batches';
import { bannerMessage } from '../api/error-messages';
import { useRecipeQuery } from '../api/recipes';
import { Loading } from '../lab-gate';
import { useLab } from '../lab-context';
import { colors, space } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { TextField } from '../ui/text-field';
import { AppText } from '../ui/text';
import { formatTemperature, formatWeighMass, formatWhen, round, useUnitSystem } from '../units';
import { BatchTimers } from './batch-timers';
import { PlanView } from './plan-view';
import { SpecimenLog } from './specimen-log';
import { statusLabels, targetText } from './batch-words';

export function BatchScreen({ batchId }: { batchId: string }) {
  const { lab, can } = useLab();
  const units = useUnitSystem();
  const query = useBatchQuery(lab.id, batchId);
  const recipe = useRecipeQuery(lab.id, query.data?.recipe.id ?? '');
  const update = useUpdateBatchMutation(lab.id, batchId);
  const [discarding, setDiscarding] = useState(false);
  const [reason, setReason] = useState('');
  if (query.isPending) return <Loading />;
  const batch = query.data;
  if (!batch) return <Banner tone="error" message={bannerMessage(query.error)} />;
  const edit = can('edit');
  const open = batch.status === 'prepared' || batch.status === 'in_use';
  const substrate = recipe.data ? substrateLabels[recipe.data.substrate] : 'treated';

  return (
    <View style={styles.screen}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        Batch {batch.code}
      </AppText>
      <AppText tone="muted" testID="batch-status">
        {statusLabels[batch.status]} · {batch.recipe.name} (revision {batch.recipe.revisionNumber})
        · prepared {formatWhen(batch.preparedAt)}
        {batch.operator ? ` by ${batch.operator}` : ''}
      </AppText>
      <Link href={`/labs/${lab.id}/batches/${batch.id}/sheet` as never} testID="batch-sheet-link">
        <AppText variant="label" style={{ color: colors.primary }}>
          Printable batch sheet
        </AppText>
      </Link>
      {update.error ? <Banner tone="error" message={bannerMessage(update.error)} /> : null}
      {batch.status === 'discarded' ? (
        <Banner tone="caution" message={`Discarded: ${batch.discardReason}`} />
      ) : null}

      <Card title="Timers" testID="batch-timers">
        <BatchTimers batch={batch} />
        {edit && open && !batch.soakStartedAt ? (
          <Button
            label="Specimens are in: start the soak"
            onPress={() => update.mutate({ startSoak: true })}
            busy={update.isPending}
            testID="start-soak"
          />
        ) : null}
      </Card>

      <Card title="Weighed" testID="batch-weigh-ins">
        <AppText tone="muted">
          {targetText(batch.target, units)} · stored at{' '}
          {formatTemperature(batch.storageTempC, units)} · tolerance ±{round(batch.tolerancePct, 2)}{' '}
          %
          {batch.waterTempC !== null
            ? ` · mixed at ${formatTemperature(batch.waterTempC, units)}`
            : ''}
          {batch.ph !== null ? ` · pH ${round(batch.ph, 2)}` : ''}
          {batch.densityGMl !== null ? ` · ${round(batch.densityGMl, 3)} g/mL` : ''}
        </AppText>
        {batch.weighIns.map((w) => (
          <View key={w.chemicalId} style={styles.row} testID={`weighed-row-${w.name}`}>
            <AppText variant="label" style={{ flex: 1 }}>
              {w.name}
              {w.lot ? ` · lot ${w.lot}` : ''}
            </AppText>
            <AppText>
              {formatWeighMass(w.weighedG, units)} of {formatWeighMass(w.targetG, units)}
            </AppText>
            <AppText
              variant="label"
              tone={w.flagged ? 'danger' : 'ok'}
              testID={`deviation-flag-${w.name}`}
            >
              {w.deviationPct >= 0 ? '+' : ''}
              {round(w.deviationPct, 2)} %{w.flagged ? ' out of tolerance' : ''}
            </AppText>
          </View>
        ))}
      </Card>

      <Card title="Specimens treated" testID="batch-specimens">
        <SpecimenLog
          batch={batch}
          labId={lab.id}
          substrate={substrate}
          canEdit={edit && batch.status !== 'discarded'}
        />
      </Card>

      <Card title="The solution">
        <PlanView plan={batch.plan} units={units} />
      </Card>

      {edit && open ? (
        <Card title="Status">
          {batch.status === 'in_use' ? (
            <Button
              label="Mark as used up"
              tone="secondary"
              onPress={() => update.mutate({ status: 'used_up' })}
              testID="used-up"
            />
          ) : null}
          {discarding ? (
            <>
              <TextField
                label="Why is it discarded?"
                value={reason}
                onChangeText={setReason}
                testID="discard-reason"
              />
              <Button
                label="Discard the batch"
                tone="danger"
                onPress={() => update.mutate({ status: 'discarded', discardReason: reason })}
                testID="confirm-discard"
              />
            </>
          ) : (
            <Button
              label="Discard…"
              tone="secondary"
              onPress={() => setDiscarding(true)}
              testID="discard"
            />
          )}
        </Card>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  screen: { gap: space.lg },
  row: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    gap: space.md,
    paddingVertical: space.xs,
    borderBottomWidth: 1,
    borderBottomColor: colors.line,
  },
});
