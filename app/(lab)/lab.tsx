import { SectionIntro } from '@/components/section-intro';
import { sectionByKey } from '@/components/sections';

export default function LabRoute() {
  return <SectionIntro section={sectionByKey('lab')} />;
}
