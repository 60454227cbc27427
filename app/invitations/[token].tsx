import { useLocalSearchParams } from 'expo-router';
import { AcceptInvitationScreen } from '@/components/auth/accept-invitation-screen';

export default function InvitationRoute() {
  const { token } = useLocalSearchParams<{ token: string }>();
  return <AcceptInvitationScreen token={token} />;
}
