import { bannerMessage } from '../api/error-messages';
import { useRecipeQuery } from '../api/recipes';
import { Loading } from '../lab-gate';
import { useLab } from '../lab-context';
import { Banner } from '../ui/banner';
import { RecipeEditor } from './recipe-editor';

export function EditRecipeScreen({ recipeId }: { recipeId: string }) {
  const { lab, can } = useLab();
  const recipe = useRecipeQuery(lab.id, recipeId);
  if (!can('edit'))
    return <Banner tone="info" message="Only technicians and managers edit recipes." />;
  if (recipe.isPending) return <Loading />;
  if (!recipe.data) return <Banner tone="error" message={bannerMessage(recipe.error)} />;
  return <RecipeEditor recipe={recipe.data} />;
}
