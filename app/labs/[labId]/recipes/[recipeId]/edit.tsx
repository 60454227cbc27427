import { useLocalSearchParams } from 'expo-router';
import { EditRecipeScreen } from '@/components/recipes/edit-recipe-screen';

export default function EditRecipeRoute() {
  const { recipeId } = useLocalSearchParams<{ recipeId: string }>();
  return <EditRecipeScreen recipeId={recipeId} />;
}
