import { ChemicalsScreen } from '@/components/chemicals/chemicals-screen';

export default function ChemicalsRoute() {
  return <ChemicalsScreen />;
}
