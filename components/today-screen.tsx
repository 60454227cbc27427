import { Link } from 'expo-router';
import { View } from 'react-native';
import { useBatchesQuery } from './api/batches';
import { useReviewQueueQuery, useSessionsQuery } from './api/burn';
import { BatchTimers } from './batches/batch-timers';
import { useLab } from './lab-context';
import { sectionByKey } from './sections';
import { SectionIntro } from './section-intro';
import { ServerStatus } from './server-status';
import { space } from './theme';
import { Card } from './ui/card';
import { AppText } from './ui/text';

function BatchLine({
  labId,
  id,
  code,
  recipe,
}: {
  labId: string;
  id: string;
  code: string;
  recipe: string;
}) {
  return (
    <Link href={`/labs/${labId}/batches/${id}` as never} testID={`today-batch-${code}`}>
      <AppText variant="label">
        {code} · {recipe}
      </AppText>
    </Link>
  );
}

export function TodayScreen() {
  const { lab } = useLab();
  const inUse = useBatchesQuery(lab.id, 'in_use');
  const prepared = useBatchesQuery(lab.id, 'prepared');
  const sessions = useSessionsQuery(lab.id);
  const queue = useReviewQueueQuery(lab.id);
  const drafts = (sessions.data?.sessions ?? []).flatMap((s) =>
    s.pairs
      .filter((p) => p.status === 'draft' || p.status === 'returned')
      .map((p) => ({ ...p, place: s.place })),
  );
  return (
    <>
      <SectionIntro section={sectionByKey('today')} />
      <Card title="Soaking and drying" testID="today-timers">
        {inUse.data?.batches.length ? (
          inUse.data.batches.map((b) => (
            <View key={b.id} style={{ gap: space.xs }}>
              <BatchLine labId={lab.id} id={b.id} code={b.code} recipe={b.recipe.name} />
              <BatchTimers batch={b} />
            </View>
          ))
        ) : (
          <AppText tone="muted">No batch is soaking or drying.</AppText>
        )}
        {prepared.data?.batches.length ? (
          <>
            <AppText variant="label" tone="muted">
              Prepared, soak not started
            </AppText>
            {prepared.data.batches.map((b) => (
              <BatchLine key={b.id} labId={lab.id} id={b.id} code={b.code} recipe={b.recipe.name} />
            ))}
          </>
        ) : null}
      </Card>
      <Card title="Burn tests to finish" testID="today-drafts">
        {drafts.length ? (
          drafts.map((p) => (
            <Link
              key={p.id}
              href={`/labs/${lab.id}/burn-tests/pairs/${p.id}` as never}
              testID={`today-draft-${p.treatedCode}`}
            >
              <AppText variant="label">
                {p.treatedCode} beside {p.controlCode} ·{' '}
                {p.status === 'returned' ? 'returned: see the comment' : 'draft'}
              </AppText>
            </Link>
          ))
        ) : (
          <AppText tone="muted">No drafts.</AppText>
        )}
      </Card>
      <Card title="Waiting for review" testID="today-reviews">
        <Link href={`/labs/${lab.id}/burn-tests/review` as never}>
          <AppText variant="label">
            {queue.data
              ? `${queue.data.pairs.length} burn test${queue.data.pairs.length === 1 ? '' : 's'} waiting`
              : '…'}
          </AppText>
        </Link>
      </Card>
      <ServerStatus />
    </>
  );
}
