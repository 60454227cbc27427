import { CriteriaScreen } from '@/components/lab/criteria-screen';

export default function CriteriaRoute() {
  return <CriteriaScreen />;
}
