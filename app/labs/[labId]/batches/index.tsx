import { BatchesScreen } from '@/components/batches/batches-screen';

export default function BatchesRoute() {
  return <BatchesScreen />;
}
