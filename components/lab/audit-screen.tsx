import { useState } from 'react';
import { StyleSheet, useWindowDimensions, View } from 'react-native';
import type { AuditAction, AuditEvent } from '../../shared/schemas/audit';
import { bannerMessage } from '../api/error-messages';
import { useAuditQuery } from '../api/labs';
import { useLab } from '../lab-context';
import { colors, radius, space, WIDE_BREAKPOINT } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { AppText } from '../ui/text';

const actionWords: Record<AuditAction, string> = {
  sign_in: 'Signed in',
  sign_in_failed: 'Failed sign-in',
  sign_out: 'Signed out',
  sign_out_everywhere: 'Signed out on every device',
  password_changed: 'Changed password',
  password_reset_requested: 'Asked for a password reset',
  password_reset: 'Reset password by e-mail link',
  lab_created: 'Created the lab',
  invitation_sent: 'Sent an invitation',
  invitation_revoked: 'Withdrew an invitation',
  invitation_accepted: 'Accepted an invitation',
  role_changed: 'Changed a role',
  member_removed: 'Removed a member',
  checklist_completed: 'Completed a burn safety checklist',
  pair_submitted: 'Submitted a burn test for review',
  pair_signed_off: 'Signed off a burn test',
  pair_returned: 'Returned a burn test',
  measurement_corrected: 'Corrected a signed-off measurement',
  pairs_imported: 'Imported burn tests from a file',
  pair_imported: 'Imported a burn test from a file',
};

function describe(e: AuditEvent): string {
  const d = e.detail as Record<string, string | undefined>;
  switch (e.action) {
    case 'role_changed':
      return `${e.target?.displayName ?? 'someone'}: ${d.from} → ${d.to}`;
    case 'member_removed':
      return `${e.target?.displayName ?? 'someone'} (was ${d.role})`;
    case 'invitation_sent':
      return `${d.email} as ${d.role}`;
    case 'sign_in_failed':
      return d.email ?? '';
    case 'pairs_imported':
      return `${d.fileName}: ${String(e.detail.pairs)} pairs`;
    case 'pair_imported':
      return `${d.fileName}, line ${String(e.detail.line)}`;
    default:
      return e.target && e.target.id !== e.actor?.id ? e.target.displayName : '';
  }
}

const PAGE_SIZE = 25;

export function AuditScreen() {
  const { lab, can } = useLab();
  const [page, setPage] = useState(1);
  const wide = useWindowDimensions().width >= WIDE_BREAKPOINT;
  const audit = useAuditQuery(lab.id, page, PAGE_SIZE);
  const pages = audit.data ? Math.max(1, Math.ceil(audit.data.total / PAGE_SIZE)) : 1;

  if (!can('manage')) {
    return <Banner tone="info" message="Only the lab's managers can read its audit log." />;
  }
  return (
    <View style={styles.screen}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        Audit log
      </AppText>
      <AppText>
        Sign-ins, invitations, role changes and removals in {lab.name}, newest first. Times are in
        your device's time zone.
      </AppText>
      {audit.error ? <Banner tone="error" message={bannerMessage(audit.error)} /> : null}
      <View style={styles.table} role="table" aria-label="Audit log">
        {wide ? (
          <View style={[styles.row, styles.head]} role="row">
            {['When', 'Who', 'What', 'Details', 'IP'].map((h, i) => (
              <AppText
                key={h}
                variant="label"
                role="columnheader"
                style={[styles.cell, i === 3 && styles.wideCell]}
              >
                {h}
              </AppText>
            ))}
          </View>
        ) : null}
        {audit.data?.events.map((e) => (
          <View
            key={e.id}
            style={[styles.row, !wide && styles.rowStacked]}
            role="row"
            testID="audit-row"
          >
            <AppText variant="small" role="cell" style={styles.cell}>
              {new Date(e.at).toLocaleString()}
            </AppText>
            <AppText variant={wide ? 'body' : 'label'} role="cell" style={styles.cell}>
              {e.actor?.displayName ?? (e.target ? `(${e.target.displayName})` : 'Unknown')}
            </AppText>
            <AppText role="cell" style={styles.cell} testID="audit-action">
              {actionWords[e.action]}
            </AppText>
            <AppText role="cell" style={[styles.cell, styles.wideCell]}>
              {describe(e)}
            </AppText>
            <AppText variant="small" tone="muted" role="cell" style={styles.cell}>
              {e.ip ?? ''}
            </AppText>
          </View>
        ))}
        {audit.data && audit.data.events.length === 0 ? (
          <AppText tone="muted">Nothing recorded yet.</AppText>
        ) : null}
      </View>
      <View style={styles.pager}>
        <Button
          label="Newer"
          tone="secondary"
          compact
          disabled={page <= 1}
          onPress={() => setPage((p) => p - 1)}
          testID="audit-newer"
        />
        <AppText testID="audit-page">
          Page {page} of {pages}
        </AppText>
        <Button
          label="Older"
          tone="secondary"
          compact
          disabled={page >= pages}
          onPress={() => setPage((p) => p + 1)}
          testID="audit-older"
        />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  screen: { gap: space.lg },
  table: {
    backgroundColor: colors.surface,
    borderWidth: 1,
    borderColor: colors.line,
    borderRadius: radius.md,
    padding: space.md,
    gap: space.xs,
  },
  row: {
    flexDirection: 'row',
    gap: space.md,
    paddingVertical: space.sm,
    borderBottomWidth: 1,
    borderBottomColor: colors.line,
  },
  rowStacked: { flexDirection: 'column', gap: 2 },
  head: { borderBottomWidth: 2, borderBottomColor: colors.ink },
  cell: { flex: 1 },
  wideCell: { flex: 2 },
  pager: {
    flexDirection: 'row',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.md,
  },
});
