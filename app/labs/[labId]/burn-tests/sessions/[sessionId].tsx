import { useLocalSearchParams } from 'expo-router';
import { SessionScreen } from '@/components/burn/session-screen';

export default function SessionRoute() {
  const { sessionId } = useLocalSearchParams<{ sessionId: string }>();
  return <SessionScreen sessionId={sessionId} />;
}
