import { useLocalSearchParams } from 'expo-router';
import { ResetPasswordScreen } from '@/components/auth/reset-password-screen';

export default function ResetPasswordRoute() {
  const { token } = useLocalSearchParams<{ token?: string }>();
  return <ResetPasswordScreen token={token} />;
}
