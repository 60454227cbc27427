import { Redirect } from 'expo-router';
import type { ReactNode } from 'react';
import { ActivityIndicator, StyleSheet, View } from 'react-native';
import { bannerMessage } from './api/error-messages';
import { useMeQuery } from './api/session';
import { AuthFrame, FrameLink } from './auth/auth-frame';
import { LabProvider } from './lab-context';
import { colors } from './theme';
import { useRequestedPath } from './use-requested-path';
import { Banner } from './ui/banner';
import { Button } from './ui/button';

export function Loading() {
  return (
    <View style={styles.loading}>
      <ActivityIndicator size="large" color={colors.primary} />
    </View>
  );
}

/**
 * Lab screens need a signed-in member of that lab. Signed out: to sign-in, coming back here
 * afterwards. Not a member (or no such lab): say so, with a way to one's own labs.
 */
export function LabGate({ labId, children }: { labId: string; children: ReactNode }) {
  const pathname = useRequestedPath();
  const me = useMeQuery();
  if (me.isPending) return <Loading />;
  if (me.error) {
    return (
      <AuthFrame title="Cannot load your lab">
        <Banner tone="error" message={bannerMessage(me.error)} />
        <Button label="Try again" onPress={() => void me.refetch()} />
      </AuthFrame>
    );
  }
  if (!me.data) return <Redirect href={{ pathname: '/sign-in', params: { next: pathname } }} />;
  const lab = me.data.labs.find((l) => l.id === labId);
  if (!lab) {
    return (
      <AuthFrame
        title="No such lab"
        intro="This lab does not exist, or you are not one of its members. A lab manager can invite you."
      >
        <FrameLink href="/" label="Go to your labs" testID="not-member-home" />
      </AuthFrame>
    );
  }
  return <LabProvider value={{ lab, me: me.data }}>{children}</LabProvider>;
}

const styles = StyleSheet.create({
  loading: {
    flex: 1,
    alignItems: 'center',
    justifyContent: 'center',
    backgroundColor: colors.paper,
  },
});
