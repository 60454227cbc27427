import { SectionIntro } from '@/components/section-intro';
import { sectionByKey } from '@/components/sections';

export default function RecipesRoute() {
  return <SectionIntro section={sectionByKey('recipes')} />;
}
