import { Link } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { Member } from '../../shared/schemas/lab';
import { type Role } from '../../shared/terms/roles';
import { bannerMessage } from '../api/error-messages';
import {
  useChangeRoleMutation,
  useInvitationsQuery,
  useMembersQuery,
  useRemoveMemberMutation,
  useWithdrawInvitationMutation,
} from '../api/labs';
import { useLab } from '../lab-context';
import { colors, space } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { Choice } from '../ui/choice';
import { AppText } from '../ui/text';
import { InviteForm } from './invite-form';
import { LabSettings } from './lab-settings';
import { roleLabels, roleOptions } from './role-words';

function MemberRow({
  member,
  labId,
  manage,
  isMe,
}: {
  member: Member;
  labId: string;
  manage: boolean;
  isMe: boolean;
}) {
  const changeRole = useChangeRoleMutation(labId);
  const remove = useRemoveMemberMutation(labId);
  const [confirming, setConfirming] = useState(false);
  const error = changeRole.error ?? remove.error;
  return (
    <View style={styles.row} testID={`member-${member.email}`}>
      <View style={styles.rowHead}>
        <AppText variant="label">
          {member.displayName}
          {isMe ? ' (you)' : ''}
        </AppText>
        <AppText variant="small" tone="muted">
          {member.email}
        </AppText>
      </View>
      {manage ? (
        <Choice<Role>
          label={`Role of ${member.displayName}`}
          options={roleOptions}
          value={member.role}
          disabled={changeRole.isPending}
          onChange={(role) => changeRole.mutate({ userId: member.userId, role })}
          testID={`role-${member.email}`}
        />
      ) : (
        <AppText testID={`role-text-${member.email}`}>{roleLabels[member.role]}</AppText>
      )}
      {error ? <Banner tone="error" message={bannerMessage(error)} /> : null}
      {manage ? (
        confirming ? (
          <View style={styles.confirm}>
            <AppText>Remove {member.displayName} from the lab? Their access ends at once.</AppText>
            <View style={styles.actions}>
              <Button
                label="Remove"
                tone="danger"
                compact
                busy={remove.isPending}
                onPress={() => remove.mutate(member.userId)}
                testID={`confirm-remove-${member.email}`}
              />
              <Button label="Keep" tone="secondary" compact onPress={() => setConfirming(false)} />
            </View>
          </View>
        ) : (
          <View style={styles.actions}>
            <Button
              label={isMe ? 'Leave the lab' : 'Remove from lab'}
              tone="secondary"
              compact
              onPress={() => setConfirming(true)}
              testID={`remove-${member.email}`}
            />
          </View>
        )
      ) : null}
    </View>
  );
}

export function MembersScreen() {
  const { lab, me, can } = useLab();
  const manage = can('manage');
  const members = useMembersQuery(lab.id);
  const invitations = useInvitationsQuery(lab.id, manage);
  const withdraw = useWithdrawInvitationMutation(lab.id);
  const pending = invitations.data?.invitations.filter((i) => i.status === 'pending') ?? [];

  return (
    <View style={styles.screen}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        Lab
      </AppText>
      <AppText>
        {lab.name}: who works here and what each may do.{' '}
        {manage
          ? 'As a manager you invite people and set their roles.'
          : 'Only managers change members and roles.'}
      </AppText>
      {manage ? (
        <Link href={`/labs/${lab.id}/lab/audit` as never} testID="link-audit" style={styles.link}>
          <AppText variant="label" style={{ color: colors.primary }}>
            Audit log: who signed in and changed what
          </AppText>
        </Link>
      ) : null}

      <Link
        href={`/labs/${lab.id}/lab/criteria` as never}
        testID="link-criteria"
        style={styles.link}
      >
        <AppText variant="label" style={{ color: colors.primary }}>
          Criteria profiles: the pass rules burn tests are judged against
        </AppText>
      </Link>

      <Card testID="members" gap="lg">
        <AppText variant="heading">Members</AppText>
        {members.error ? <Banner tone="error" message={bannerMessage(members.error)} /> : null}
        {members.data?.members.map((m) => (
          <MemberRow
            key={m.userId}
            member={m}
            labId={lab.id}
            manage={manage}
            isMe={m.userId === me.user.id}
          />
        ))}
      </Card>

      {manage ? <LabSettings labId={lab.id} /> : null}

      {manage ? (
        <Card testID="invite" gap="lg">
          <AppText variant="heading">Invite someone</AppText>
          <InviteForm labId={lab.id} />
          {pending.length ? (
            <View style={styles.pending}>
              <AppText variant="label" tone="muted">
                Waiting for an answer
              </AppText>
              {pending.map((i) => (
                <View key={i.id} style={styles.pendingRow} testID={`invitation-${i.email}`}>
                  <AppText style={{ flex: 1 }}>
                    {i.email} · {roleLabels[i.role]}
                  </AppText>
                  <Button
                    label="Withdraw"
                    tone="secondary"
                    compact
                    onPress={() => withdraw.mutate(i.id)}
                  />
                </View>
              ))}
            </View>
          ) : null}
        </Card>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  screen: { gap: space.lg },
  row: {
    gap: space.sm,
    paddingBottom: space.lg,
    borderBottomWidth: 1,
    borderBottomColor: colors.line,
  },
  rowHead: { gap: 2 },
  actions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
  confirm: { gap: space.sm },
  pending: { gap: space.sm },
  pendingRow: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  link: { paddingVertical: space.xs },
});
