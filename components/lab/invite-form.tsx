import { useState } from 'react';
import { Controller } from 'react-hook-form';
import { View } from 'react-native';
import { roleSummaries } from '../../shared/terms/roles';
import { useInviteMutation } from '../api/labs';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { Choice } from '../ui/choice';
import { FormStack, FormTextField, useSubmit, useZodForm } from '../ui/form';
import { AppText } from '../ui/text';
import { roleOptions } from './role-words';

export function InviteForm({ labId }: { labId: string }) {
  const form = useZodForm((k) => k.createInvitationSchema, { email: '', role: 'technician' });
  const invite = useInviteMutation(labId);
  const [sentTo, setSentTo] = useState<string>();
  const role = form.watch('role');

  const { banner, submit } = useSubmit(form, async (values) => {
    setSentTo(undefined);
    const sent = await invite.mutateAsync(values);
    setSentTo(sent.email);
    form.reset({ email: '', role: values.role });
  });

  return (
    <FormStack banner={banner}>
      {sentTo ? (
        <Banner
          tone="success"
          testID="invite-sent"
          message={`Invitation sent to ${sentTo}. The link works once, for 7 days.`}
        />
      ) : null}
      <FormTextField
        control={form.control}
        name="email"
        label="E-mail of the person to invite"
        keyboardType="email-address"
        autoCapitalize="none"
        inputMode="email"
      />
      <View style={{ gap: 6 }}>
        <AppText variant="label">Role</AppText>
        <Controller
          control={form.control}
          name="role"
          render={({ field }) => (
            <Choice
              label="Role"
              options={roleOptions}
              value={field.value}
              onChange={field.onChange}
              testID="invite-role"
            />
          )}
        />
        <AppText variant="small" tone="muted">
          {roleSummaries[role]}
        </AppText>
      </View>
      <Button
        label="Send invitation"
        onPress={submit}
        busy={invite.isPending}
        testID="invite-submit"
      />
    </FormStack>
  );
}
