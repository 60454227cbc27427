import { Link } from 'expo-router';
import { View } from 'react-native';
import { statusLabels } from '../../shared/terms/burn';
import { useSessionsQuery } from '../api/burn';
import { bannerMessage } from '../api/error-messages';
import { useLab } from '../lab-context';
import { colors, space } from '../theme';
import { Banner } from '../ui/banner';
import { Card } from '../ui/card';
import { ScreenHeader } from '../ui/screen-header';
import { AppText } from '../ui/text';
import { formatWhen } from '../units';
import { BenchCaution } from './bench-caution';

export function SessionsScreen() {
  const { lab, can } = useLab();
  const sessions = useSessionsQuery(lab.id);
  const list = sessions.data?.sessions ?? [];
  return (
    <View style={{ gap: space.lg }}>
      <ScreenHeader
        title="Burn tests"
        action={
          can('edit')
            ? {
                href: `/labs/${lab.id}/burn-tests/new`,
                label: 'New session',
                testID: 'new-session',
              }
            : undefined
        }
      />
      <AppText>
        Paired burn tests: a treated specimen beside an untreated control, under the same
        conditions.
      </AppText>
      <BenchCaution />
      <Link href={`/labs/${lab.id}/burn-tests/review` as never} testID="link-review-queue">
        <AppText variant="label" style={{ color: colors.primary }}>
          Waiting for review
        </AppText>
      </Link>
      {sessions.error ? <Banner tone="error" message={bannerMessage(sessions.error)} /> : null}
      {sessions.isSuccess && !list.length ? (
        <AppText tone="muted">No burn sessions yet.</AppText>
      ) : null}
      {list.map((s) => (
        <Link
          key={s.id}
          href={`/labs/${lab.id}/burn-tests/sessions/${s.id}` as never}
          testID={`session-${s.place}`}
        >
          <Card>
            <AppText variant="heading">
              {formatWhen(s.heldAt)} · {s.place}
            </AppText>
            <AppText tone="muted">
              {s.pairs.length} pair{s.pairs.length === 1 ? '' : 's'}
              {s.pairs.length ? ` · ${s.pairs.map((p) => statusLabels[p.status]).join(', ')}` : ''}
              {s.checklistCompletedAt ? '' : ' · safety checklist not complete'}
            </AppText>
          </Card>
        </Link>
      ))}
    </View>
  );
}
