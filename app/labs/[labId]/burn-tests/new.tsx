import { NewSessionScreen } from '@/components/burn/new-session-screen';

export default function NewSessionRoute() {
  return <NewSessionScreen />;
}
