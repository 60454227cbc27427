import { useConfirmResetMutation } from '../api/session';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { FormStack, FormTextField, useSubmit, useZodForm } from '../ui/form';
import { AuthFrame, FrameLink } from './auth-frame';

export function ResetPasswordScreen({ token }: { token?: string }) {
  const form = useZodForm((k) => k.resetPasswordFormSchema, { newPassword: '' });
  const confirm = useConfirmResetMutation();

  const { banner, submit } = useSubmit(form, async ({ newPassword }) => {
    await confirm.mutateAsync({ token: token ?? '', newPassword });
  });

  if (!token) {
    return (
      <AuthFrame title="Choose a new password">
        <Banner
          tone="error"
          message="This link is not complete. Open the link from the e-mail again, or ask for a new one."
        />
        <FrameLink href="/forgot-password" label="Ask for a new link" />
      </AuthFrame>
    );
  }
  return (
    <AuthFrame
      title="Choose a new password"
      intro="You will be signed out everywhere, then you can sign in with the new password."
    >
      {confirm.isSuccess ? (
        <Banner
          tone="success"
          testID="reset-done"
          message="Your password is changed. Sign in with it now."
        />
      ) : (
        <FormStack banner={banner}>
          <FormTextField
            control={form.control}
            name="newPassword"
            label="New password"
            secureTextEntry
            autoComplete="new-password"
            hint="At least 10 characters; not your e-mail address."
          />
          <Button
            label="Set the new password"
            onPress={submit}
            busy={confirm.isPending}
            testID="reset-confirm-submit"
          />
        </FormStack>
      )}
      <FrameLink href="/sign-in" label="Go to sign in" />
    </AuthFrame>
  );
}
