import { router } from 'expo-router';
import { useSignUpMutation } from '../api/session';
import { Button } from '../ui/button';
import { FormStack, FormTextField, useSubmit, useZodForm } from '../ui/form';
import { AuthFrame, FrameLink } from './auth-frame';

export function SignUpScreen() {
  const form = useZodForm((k) => k.signUpSchema, {
    email: '',
    password: '',
    displayName: '',
    labName: '',
  });
  const signUp = useSignUpMutation();

  const { banner, submit } = useSubmit(form, async (values) => {
    const res = await signUp.mutateAsync(values);
    const lab = res.me.labs[0];
    router.replace(lab ? `/labs/${lab.id}` : '/');
  });

  return (
    <AuthFrame
      title="Create an account"
      intro="You also create your lab, the shared workspace for your team's recipes, batches and burn tests. You will be its manager and can invite others."
    >
      <FormStack banner={banner}>
        <FormTextField
          control={form.control}
          name="displayName"
          label="Your name"
          autoComplete="name"
        />
        <FormTextField
          control={form.control}
          name="email"
          label="E-mail"
          autoComplete="email"
          keyboardType="email-address"
          autoCapitalize="none"
          inputMode="email"
        />
        <FormTextField
          control={form.control}
          name="password"
          label="Password"
          secureTextEntry
          autoComplete="new-password"
          hint="At least 10 characters; not your e-mail address."
        />
        <FormTextField
          control={form.control}
          name="labName"
          label="Lab name"
          hint="For example your workshop, class or company."
        />
        <Button
          label="Create account and lab"
          onPress={submit}
          busy={signUp.isPending}
          testID="sign-up-submit"
        />
      </FormStack>
      <FrameLink href="/sign-in" label="Already have an account? Sign in" />
    </AuthFrame>
  );
}
