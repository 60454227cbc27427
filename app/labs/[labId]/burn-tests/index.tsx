import { SessionsScreen } from '@/components/burn/sessions-screen';

export default function BurnTestsRoute() {
  return <SessionsScreen />;
}
