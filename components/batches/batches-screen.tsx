import { Link } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { batchStatuses, type BatchStatus } from '../../shared/terms/batch';
import { useBatchesQuery } from '../api/batches';
import { bannerMessage } from '../api/error-messages';
import { useLab } from '../lab-context';
import { space } from '../theme';
import { Banner } from '../ui/banner';
import { Card } from '../ui/card';
import { ScreenHeader } from '../ui/screen-header';
import { Choice } from '../ui/choice';
import { AppText } from '../ui/text';
import { formatWhen, useUnitSystem } from '../units';
import { BatchTimers } from './batch-timers';
import { statusLabels, targetText } from './batch-words';

const filters = [
  { value: '' as const, label: 'All' },
  ...batchStatuses.map((s) => ({ value: s, label: statusLabels[s] })),
];

export function BatchesScreen() {
  const { lab, can } = useLab();
  const units = useUnitSystem();
  const [status, setStatus] = useState<BatchStatus | ''>('');
  const batches = useBatchesQuery(lab.id, status);
  const list = batches.data?.batches ?? [];
  return (
    <View style={styles.screen}>
      <ScreenHeader
        title="Batches"
        action={
          can('edit')
            ? { href: `/labs/${lab.id}/batches/new`, label: 'Prepare a batch', testID: 'new-batch' }
            : undefined
        }
      />
      <AppText>
        Each preparation of a recipe: what was weighed, by whom and when, and the specimens treated
        in it.
      </AppText>
      <Choice
        label="Status"
        options={filters}
        value={status}
        onChange={setStatus}
        testID="batch-filter"
      />
      {batches.error ? <Banner tone="error" message={bannerMessage(batches.error)} /> : null}
      {batches.isSuccess && list.length === 0 ? (
        <AppText tone="muted">No batches{status ? ' with this status' : ' yet'}.</AppText>
      ) : null}
      {list.map((b) => (
        <Link
          key={b.id}
          href={`/labs/${lab.id}/batches/${b.id}` as never}
          testID={`batch-${b.code}`}
        >
          <Card>
            <AppText variant="heading">
              {b.code} · {statusLabels[b.status]}
            </AppText>
            <AppText>
              {b.recipe.name} (rev. {b.recipe.revisionNumber}) · {targetText(b.target, units)}
            </AppText>
            <AppText variant="small" tone="muted">
              Prepared {formatWhen(b.preparedAt)}
              {b.operator ? ` by ${b.operator}` : ''}
              {b.anyOutOfTolerance ? ' · a weighed mass is out of tolerance' : ''}
            </AppText>
            {b.status === 'in_use' ? <BatchTimers batch={b} /> : null}
          </Card>
        </Link>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  screen: { gap: space.lg },
});
