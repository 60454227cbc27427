import { SectionIntro } from '@/components/section-intro';
import { sectionByKey } from '@/components/sections';

export default function BurnTestsRoute() {
  return <SectionIntro section={sectionByKey('burn-tests')} />;
}
