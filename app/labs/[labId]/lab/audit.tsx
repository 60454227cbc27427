import { AuditScreen } from '@/components/lab/audit-screen';

export default function AuditRoute() {
  return <AuditScreen />;
}
