import { AccountScreen } from '@/components/account-screen';

export default function AccountRoute() {
  return <AccountScreen />;
}
