import { useLocalSearchParams } from 'expo-router';
import { TimerScreen } from '@/components/burn/timer-screen';

export default function TimerRoute() {
  const { pairId } = useLocalSearchParams<{ pairId: string }>();
  return <TimerScreen pairId={pairId} />;
}
