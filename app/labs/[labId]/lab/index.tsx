import { MembersScreen } from '@/components/lab/members-screen';

export default function LabRoute() {
  return <MembersScreen />;
}
