import { SectionIntro } from '@/components/section-intro';
import { sectionByKey } from '@/components/sections';

export default function BatchesRoute() {
  return <SectionIntro section={sectionByKey('batches')} />;
}
