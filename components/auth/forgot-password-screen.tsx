import { useRequestResetMutation } from '../api/session';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { FormStack, FormTextField, useSubmit, useZodForm } from '../ui/form';
import { AuthFrame, FrameLink } from './auth-frame';

export function ForgotPasswordScreen() {
  const form = useZodForm((k) => k.resetRequestSchema, { email: '' });
  const request = useRequestResetMutation();

  const { banner, submit } = useSubmit(form, async (values) => {
    await request.mutateAsync(values);
  });

  return (
    <AuthFrame
      title="Reset your password"
      intro="We will e-mail you a link to choose a new password. It works once, for 30 minutes."
    >
      {request.isSuccess ? (
        <Banner
          tone="success"
          testID="reset-sent"
          message="If this address has an account, the link is on its way. Check your inbox (and the spam folder)."
        />
      ) : (
        <FormStack banner={banner}>
          <FormTextField
            control={form.control}
            name="email"
            label="E-mail"
            autoComplete="email"
            keyboardType="email-address"
            autoCapitalize="none"
            inputMode="email"
          />
          <Button
            label="Send the link"
            onPress={submit}
            busy={request.isPending}
            testID="reset-request-submit"
          />
        </FormStack>
      )}
      <FrameLink href="/sign-in" label="Back to sign in" />
    </AuthFrame>
  );
}
