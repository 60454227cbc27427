import { Slot, type ErrorBoundaryProps } from 'expo-router';
import { StatusBar } from 'expo-status-bar';
import { ErrorScreen } from '@/components/error-screen';
import { Providers } from '@/components/providers';
import { useAppFonts } from '@/components/fonts';

export function ErrorBoundary({ error, retry }: ErrorBoundaryProps) {
  return <ErrorScreen error={error} onRetry={() => void retry()} />;
}

export default function RootLayout() {
  // Without the fonts the app still works in the system face; on a phone it waits for them first.
  if (!useAppFonts()) return null;
  return (
    <Providers>
      <StatusBar style="light" />
      <Slot />
    </Providers>
  );
}
