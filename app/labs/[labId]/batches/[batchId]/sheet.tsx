import { useLocalSearchParams } from 'expo-router';
import { BatchSheetScreen } from '@/components/batches/batch-sheet-screen';

export default function BatchSheetRoute() {
  const { batchId } = useLocalSearchParams<{ batchId: string }>();
  return <BatchSheetScreen batchId={batchId} />;
}
