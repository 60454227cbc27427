import { RecipesScreen } from '@/components/recipes/recipes-screen';

export default function RecipesRoute() {
  return <RecipesScreen />;
}
