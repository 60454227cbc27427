import { useLocalSearchParams } from 'expo-router';
import { rankingFiltersFrom } from '@/components/api/rankings';
import { TreatmentScreen } from '@/components/rankings/treatment-screen';

export default function TreatmentRoute() {
  const { treatmentKey, ...params } = useLocalSearchParams<{ treatmentKey: string }>();
  return <TreatmentScreen treatmentKey={treatmentKey} filters={rankingFiltersFrom(params)} />;
}
