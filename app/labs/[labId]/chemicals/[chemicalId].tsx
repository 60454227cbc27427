import { useLocalSearchParams } from 'expo-router';
import { ChemicalScreen } from '@/components/chemicals/chemical-screen';

export default function ChemicalRoute() {
  const { chemicalId } = useLocalSearchParams<{ chemicalId: string }>();
  return <ChemicalScreen chemicalId={chemicalId} />;
}
