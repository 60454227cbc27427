import { router } from 'expo-router';
import { View } from 'react-native';
import { useSignInMutation } from '../api/session';
import { Button } from '../ui/button';
import { FormStack, FormTextField, useSubmit, useZodForm } from '../ui/form';
import { AuthFrame, FrameLink } from './auth-frame';
import { safeNext } from './next-path';

export function SignInScreen({ next }: { next?: string }) {
  const form = useZodForm((k) => k.signInSchema, {
    email: '',
    password: '',
    tokenDelivery: 'cookie',
  });
  const signIn = useSignInMutation();
  const target = safeNext(next);

  const { banner, submit } = useSubmit(form, async (values) => {
    await signIn.mutateAsync(values);
    router.replace((target ?? '/') as never);
  });

  return (
    <AuthFrame
      title="Sign in"
      intro={target ? 'Sign in to open the page you asked for.' : undefined}
    >
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
        <FormTextField
          control={form.control}
          name="password"
          label="Password"
          secureTextEntry
          autoComplete="current-password"
          onSubmitEditing={submit}
        />
        <Button label="Sign in" onPress={submit} busy={signIn.isPending} testID="sign-in-submit" />
      </FormStack>
      <View>
        <FrameLink href="/forgot-password" label="Forgot your password?" testID="link-forgot" />
        <FrameLink
          href="/sign-up"
          label="New here? Create an account and a lab"
          testID="link-sign-up"
        />
      </View>
    </AuthFrame>
  );
}
