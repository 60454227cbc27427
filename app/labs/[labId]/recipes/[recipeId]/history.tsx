import { useLocalSearchParams } from 'expo-router';
import { RecipeHistoryScreen } from '@/components/recipes/recipe-history-screen';

export default function RecipeHistoryRoute() {
  const { recipeId } = useLocalSearchParams<{ recipeId: string }>();
  return <RecipeHistoryScreen recipeId={recipeId} />;
}
