import { HomeScreen } from '@/components/home-screen';

export default function HomeRoute() {
  return <HomeScreen />;
}
