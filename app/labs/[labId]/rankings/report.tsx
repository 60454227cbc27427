import { ReportScreen } from '@/components/rankings/report-screen';

export default function ReportRoute() {
  return <ReportScreen />;
}
