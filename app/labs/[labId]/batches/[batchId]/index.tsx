import { useLocalSearchParams } from 'expo-router';
import { BatchScreen } from '@/components/batches/batch-screen';

export default function BatchRoute() {
  const { batchId } = useLocalSearchParams<{ batchId: string }>();
  return <BatchScreen batchId={batchId} />;
}
