import { Slot } from 'expo-router';
import { AppShell } from '@/components/app-shell';

export default function LabLayout() {
  return (
    <AppShell>
      <Slot />
    </AppShell>
  );
}
