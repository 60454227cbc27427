import { Redirect, router } from 'expo-router';
import { bannerMessage } from './api/error-messages';
import { useCreateLabMutation } from './api/labs';
import { useMeQuery, useSignOutMutation } from './api/session';
import { AuthFrame } from './auth/auth-frame';
import { Loading } from './lab-gate';
import { Banner } from './ui/banner';
import { Button } from './ui/button';
import { FormStack, FormTextField, useSubmit, useZodForm } from './ui/form';

function NoLab() {
  const form = useZodForm((k) => k.createLabSchema, { name: '' });
  const create = useCreateLabMutation();
  const signOut = useSignOutMutation();
  const { banner, submit } = useSubmit(form, async ({ name }) => {
    const lab = await create.mutateAsync(name);
    router.replace(`/labs/${lab.id}` as never);
  });
  return (
    <AuthFrame
      title="You are not in a lab"
      intro="Ask a lab manager to invite you, or start a lab of your own."
    >
      <FormStack banner={banner}>
        <FormTextField control={form.control} name="name" label="Name of your new lab" />
        <Button label="Create the lab" onPress={submit} busy={create.isPending} />
      </FormStack>
      <Button label="Sign out" tone="secondary" onPress={() => signOut.mutate()} />
    </AuthFrame>
  );
}

/** "/": your first lab when signed in, sign-in otherwise. */
export function HomeScreen() {
  const me = useMeQuery();
  if (me.isPending) return <Loading />;
  if (me.error) {
    return (
      <AuthFrame title="Cannot reach Quenchbook">
        <Banner tone="error" message={bannerMessage(me.error)} />
        <Button label="Try again" onPress={() => void me.refetch()} />
      </AuthFrame>
    );
  }
  if (!me.data) return <Redirect href="/sign-in" />;
  const first = me.data.labs[0];
  if (!first) return <NoLab />;
  return <Redirect href={`/labs/${first.id}` as never} />;
}
