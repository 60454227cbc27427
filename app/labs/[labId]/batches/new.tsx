import { useLocalSearchParams } from 'expo-router';
import { NewBatchScreen } from '@/components/batches/new-batch-screen';

export default function NewBatchRoute() {
  const { recipeId } = useLocalSearchParams<{ recipeId?: string }>();
  return <NewBatchScreen recipeId={recipeId} />;
}
