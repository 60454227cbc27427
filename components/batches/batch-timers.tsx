import { useEffect, useState } from 'react';
import type { Batch } from '../../shared/schemas/batch';
import { AppText } from '../ui/text';
import { formatWhen } from '../units';

function left(iso: string, now: number): string {
  const ms = Date.parse(iso) - now;
  if (ms <= 0) return 'done';
  const minutes = Math.ceil(ms / 60_000);
  return minutes < 120 ? `${minutes} min left` : `${Math.round((minutes / 60) * 10) / 10} h left`;
}

/** Soak end and drying-ready times, counting down once a minute. */
export function BatchTimers({
  batch,
}: {
  batch: Pick<Batch, 'soakEndsAt' | 'dryingReadyAt' | 'soakStartedAt'>;
}) {
  const [now, setNow] = useState(Date.now);
  useEffect(() => {
    const timer = setInterval(() => setNow(Date.now()), 30_000);
    return () => clearInterval(timer);
  }, []);
  if (!batch.soakEndsAt) return <AppText tone="muted">Soak not started.</AppText>;
  return (
    <>
      <AppText testID="soak-ends">
        Soak ends {formatWhen(batch.soakEndsAt)} ({left(batch.soakEndsAt, now)})
      </AppText>
      {batch.dryingReadyAt ? (
        <AppText testID="drying-ready">
          Dry and ready {formatWhen(batch.dryingReadyAt)} ({left(batch.dryingReadyAt, now)})
        </AppText>
      ) : null}
    </>
  );
}
