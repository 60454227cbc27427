import { Slot, useLocalSearchParams } from 'expo-router';
import { AppShell } from '@/components/app-shell';
import { LabGate } from '@/components/lab-gate';

export default function LabLayout() {
  const { labId } = useLocalSearchParams<{ labId: string }>();
  return (
    <LabGate labId={labId}>
      <AppShell>
        <Slot />
      </AppShell>
    </LabGate>
  );
}
