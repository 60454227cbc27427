import { useLocalSearchParams } from 'expo-router';
import { PairScreen } from '@/components/burn/pair-screen';

export default function PairRoute() {
  const { pairId } = useLocalSearchParams<{ pairId: string }>();
  return <PairScreen pairId={pairId} />;
}
