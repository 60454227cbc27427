import { router } from 'expo-router';
import { View } from 'react-native';
import { roleSummaries } from '../../shared/terms/roles';
import { ApiError } from '../api/client';
import { bannerMessage } from '../api/error-messages';
import { useAcceptInvitationMutation, useInvitationPreviewQuery } from '../api/labs';
import { useMeQuery } from '../api/session';
import { Loading } from '../lab-gate';
import { roleLabels } from '../lab/role-words';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { FormStack, FormTextField, useSubmit, useZodForm } from '../ui/form';
import { AppText } from '../ui/text';
import { AuthFrame, FrameLink } from './auth-frame';

function NewcomerForm({ token, email }: { token: string; email: string }) {
  const form = useZodForm((k) => k.newcomerFormSchema, { displayName: '', password: '' });
  const accept = useAcceptInvitationMutation(token);
  const { banner, submit } = useSubmit(form, async (values) => {
    const res = await accept.mutateAsync(values);
    const labId = 'me' in res ? res.me.labs[0]?.id : res.labId;
    router.replace(`/labs/${labId}` as never);
  });
  return (
    <FormStack banner={banner}>
      <AppText>Create your account for {email}.</AppText>
      <FormTextField
        control={form.control}
        name="displayName"
        label="Your name"
        autoComplete="name"
      />
      <FormTextField
        control={form.control}
        name="password"
        label="Choose a password"
        secureTextEntry
        autoComplete="new-password"
        hint="At least 10 characters; not your e-mail address."
      />
      <Button
        label="Create account and join"
        onPress={submit}
        busy={accept.isPending}
        testID="accept-submit"
      />
    </FormStack>
  );
}

function MemberJoin({
  token,
  signedInAs,
  invited,
}: {
  token: string;
  signedInAs?: string;
  invited: string;
}) {
  const accept = useAcceptInvitationMutation(token);
  const join = async () => {
    const res = await accept.mutateAsync({});
    const labId = 'me' in res ? res.me.labs[0]?.id : res.labId;
    router.replace(`/labs/${labId}` as never);
  };
  if (!signedInAs) {
    return (
      <View style={{ gap: 12 }}>
        <AppText>
          You already have an account for {invited}. Sign in, and you will come back here to join.
        </AppText>
        <FrameLink
          href={{ pathname: '/sign-in', params: { next: `/invitations/${token}` } }}
          label="Sign in to accept"
          testID="accept-sign-in"
        />
      </View>
    );
  }
  return (
    <View style={{ gap: 12 }}>
      {accept.error ? <Banner tone="error" message={bannerMessage(accept.error)} /> : null}
      {signedInAs !== invited ? (
        <Banner
          tone="caution"
          message={`You are signed in as ${signedInAs}, but this invitation is for ${invited}. Sign out and sign in with that address.`}
        />
      ) : null}
      <Button
        label="Join the lab"
        onPress={() => void join().catch(() => undefined)}
        busy={accept.isPending}
        testID="accept-join"
      />
    </View>
  );
}

export function AcceptInvitationScreen({ token }: { token: string }) {
  const preview = useInvitationPreviewQuery(token);
  const me = useMeQuery();
  if (preview.isPending || me.isPending) return <Loading />;
  if (preview.error) {
    const gone = preview.error instanceof ApiError && preview.error.code === 'invalid_link';
    return (
      <AuthFrame title="Invitation">
        <Banner
          tone="error"
          message={
            gone
              ? 'This invitation has expired, was already used or was withdrawn. Ask the lab manager for a new one.'
              : bannerMessage(preview.error)
          }
        />
        <FrameLink href="/" label="Go to Quenchbook" />
      </AuthFrame>
    );
  }
  const inv = preview.data;
  return (
    <AuthFrame
      title={`Join ${inv.labName}`}
      intro={`${inv.inviterName ?? 'A manager'} invited you as ${roleLabels[inv.role].toLowerCase()}. ${roleSummaries[inv.role]}`}
    >
      {inv.accountExists ? (
        <MemberJoin token={token} invited={inv.email} signedInAs={me.data?.user.email} />
      ) : (
        <NewcomerForm token={token} email={inv.email} />
      )}
    </AuthFrame>
  );
}
