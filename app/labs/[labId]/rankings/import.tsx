import { ImportScreen } from '@/components/rankings/import-screen';

export default function ImportRoute() {
  return <ImportScreen />;
}
