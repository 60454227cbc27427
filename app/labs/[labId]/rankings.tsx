import { SectionIntro } from '@/components/section-intro';
import { sectionByKey } from '@/components/sections';

export default function RankingsRoute() {
  return <SectionIntro section={sectionByKey('rankings')} />;
}
