import { sectionByKey } from './sections';
import { SectionIntro } from './section-intro';
import { ServerStatus } from './server-status';

export function TodayScreen() {
  return (
    <>
      <SectionIntro section={sectionByKey('today')} />
      <ServerStatus />
    </>
  );
}
