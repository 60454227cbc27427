import { RankingsScreen } from '@/components/rankings/rankings-screen';

export default function RankingsRoute() {
  return <RankingsScreen />;
}
