import { TodayScreen } from '@/components/today-screen';

export default function TodayRoute() {
  return <TodayScreen />;
}
