import { Link } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { useReviewQueueQuery } from '../api/burn';
import { bannerMessage } from '../api/error-messages';
import { Loading } from '../lab-gate';
import { useLab } from '../lab-context';
import { colors, space } from '../theme';
import { Banner } from '../ui/banner';
import { Card } from '../ui/card';
import { AppText } from '../ui/text';
import { formatWhen } from '../units';

const modeWords = {
  simultaneous: 'Burned side by side',
  sequential: 'Burned one after the other',
} as const;

/** Burn tests submitted and not yet signed off or returned, in the order the server lists them. */
export function ReviewQueueScreen() {
  const { lab, can } = useLab();
  const queue = useReviewQueueQuery(lab.id);
  const pairs = queue.data?.pairs ?? [];

  return (
    <View style={styles.screen}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        Waiting for review
      </AppText>
      <Link href={`/labs/${lab.id}/burn-tests` as never} testID="back-to-burn-tests">
        <AppText variant="label" style={{ color: colors.primary }}>
          ← Back to burn tests
        </AppText>
      </Link>
      <AppText>
        Burn tests that were submitted and now wait for someone to check them and sign them off, or
        send them back with a comment.
      </AppText>
      {can('review') ? null : (
        <Banner tone="info" message="Reviewers and managers sign tests off." testID="review-note" />
      )}
      {queue.isPending ? <Loading /> : null}
      {queue.error ? <Banner tone="error" message={bannerMessage(queue.error)} /> : null}
      {queue.isSuccess && pairs.length === 0 ? (
        <AppText tone="muted" testID="review-empty">
          Nothing waits for review.
        </AppText>
      ) : null}
      {pairs.map((p) => (
        <Link
          key={p.id}
          href={`/labs/${lab.id}/burn-tests/pairs/${p.id}` as never}
          testID={`review-${p.id}`}
        >
          <Card gap="xs">
            <AppText variant="heading">
              {p.controlCode} vs {p.treatedCode}
            </AppText>
            <AppText>{p.recipeName ?? 'No recipe recorded'}</AppText>
            <AppText variant="small" tone="muted">
              Submitted {formatWhen(p.submittedAt ?? p.createdAt)} · {modeWords[p.mode]}
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
