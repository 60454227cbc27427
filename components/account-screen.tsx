import { router } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { type UnitSystem } from '../shared/terms/roles';
import { bannerMessage } from './api/error-messages';
import { useChangePasswordMutation, useSignOutMutation, useUpdateMeMutation } from './api/session';
import { useLab } from './lab-context';
import { space } from './theme';
import { Banner } from './ui/banner';
import { Button } from './ui/button';
import { Card } from './ui/card';
import { Choice } from './ui/choice';
import { FormStack, FormTextField, useSubmit, useZodForm } from './ui/form';
import { AppText } from './ui/text';

const unitOptions = [
  { value: 'metric' as const, label: 'Metric (g, mm, mL, °C)' },
  { value: 'us' as const, label: 'US customary (oz, in, fl oz, °F)' },
];

function PasswordCard() {
  const form = useZodForm((k) => k.changePasswordSchema, { currentPassword: '', newPassword: '' });
  const change = useChangePasswordMutation();
  const { banner, submit } = useSubmit(form, async (values) => {
    await change.mutateAsync(values);
    form.reset();
  });
  return (
    <Card title="Password" testID="password-card">
      {change.isSuccess ? (
        <Banner tone="success" message="Password changed. Your other devices were signed out." />
      ) : null}
      <FormStack banner={banner}>
        <FormTextField
          control={form.control}
          name="currentPassword"
          label="Current password"
          secureTextEntry
          autoComplete="current-password"
        />
        <FormTextField
          control={form.control}
          name="newPassword"
          label="New password"
          secureTextEntry
          autoComplete="new-password"
          hint="At least 10 characters; not your e-mail address."
        />
        <Button
          label="Change password"
          onPress={submit}
          busy={change.isPending}
          testID="change-password-submit"
        />
      </FormStack>
    </Card>
  );
}

export function AccountScreen() {
  const { me } = useLab();
  const updateMe = useUpdateMeMutation();
  const signOut = useSignOutMutation();
  const signOutEverywhere = useSignOutMutation(true);
  const leave = async (mutation: typeof signOut) => {
    await mutation.mutateAsync();
    router.replace('/sign-in');
  };
  const error = updateMe.error ?? signOut.error ?? signOutEverywhere.error;

  return (
    <View style={styles.screen}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        Account
      </AppText>
      <AppText>
        {me.user.displayName} · {me.user.email}
      </AppText>
      {error ? <Banner tone="error" message={bannerMessage(error)} /> : null}
      <Card title="Display units" testID="units-card">
        <AppText tone="muted">
          Used on every screen that shows a length, mass, volume or temperature. What is stored does
          not change.
        </AppText>
        <Choice<UnitSystem>
          label="Display units"
          options={unitOptions}
          value={me.user.units}
          disabled={updateMe.isPending}
          onChange={(units) => updateMe.mutate({ units })}
          testID="units"
        />
      </Card>
      <PasswordCard />
      <Card title="Sign out">
        <View style={styles.actions}>
          <Button
            label="Sign out"
            tone="secondary"
            onPress={() => void leave(signOut)}
            busy={signOut.isPending}
            testID="sign-out"
          />
          <Button
            label="Sign out on every device"
            tone="danger"
            onPress={() => void leave(signOutEverywhere)}
            busy={signOutEverywhere.isPending}
            testID="sign-out-everywhere"
          />
        </View>
        <AppText variant="small" tone="muted">
          Use "every device" if you lost a phone or signed in on a shared computer.
        </AppText>
      </Card>
    </View>
  );
}

const styles = StyleSheet.create({
  screen: { gap: space.lg },
  actions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
});
