import { useHealthQuery } from './api/health';
import { Card } from './ui/card';
import { AppText } from './ui/text';

/** A small card that says whether the server and its database answer. */
export function ServerStatus() {
  const { data, error, isPending } = useHealthQuery();
  let text = 'Checking the server…';
  let tone: 'muted' | 'ok' | 'danger' = 'muted';
  if (error) {
    text = error.message;
    tone = 'danger';
  } else if (data) {
    const up = data.db === 'ok';
    text = up
      ? `Server and database are up (version ${data.version}).`
      : 'The server is up but its database does not answer. Records cannot be saved right now.';
    tone = up ? 'ok' : 'danger';
  }
  return (
    <Card testID="server-status" gap="xs">
      <AppText variant="label" tone="muted">
        Server
      </AppText>
      <AppText tone={isPending ? 'muted' : tone}>{text}</AppText>
    </Card>
  );
}
