import { useLocalSearchParams } from 'expo-router';
import { RecipeScreen } from '@/components/recipes/recipe-screen';

export default function RecipeRoute() {
  const { recipeId } = useLocalSearchParams<{ recipeId: string }>();
  return <RecipeScreen recipeId={recipeId} />;
}
