import { RecipeEditor } from '@/components/recipes/recipe-editor';

export default function NewRecipeRoute() {
  return <RecipeEditor />;
}
