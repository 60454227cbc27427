import {
  SourceSans3_400Regular,
  SourceSans3_600SemiBold,
  SourceSans3_700Bold,
  useFonts,
} from '@expo-google-fonts/source-sans-3';
import { Slot, type ErrorBoundaryProps } from 'expo-router';
import { StatusBar } from 'expo-status-bar';
import { ErrorScreen } from '@/components/error-screen';
import { Providers } from '@/components/providers';
import { fontFaces } from '@/components/theme';

export function ErrorBoundary({ error, retry }: ErrorBoundaryProps) {
  return <ErrorScreen error={error} onRetry={() => void retry()} />;
}

export default function RootLayout() {
  const [loaded, fontError] = useFonts({
    [fontFaces.regular]: SourceSans3_400Regular,
    [fontFaces.semibold]: SourceSans3_600SemiBold,
    [fontFaces.bold]: SourceSans3_700Bold,
  });
  // Without the fonts the app still works in the system face; it just waits for them first.
  if (!loaded && !fontError) return null;
  return (
    <Providers>
      <StatusBar style="light" />
      <Slot />
    </Providers>
  );
}
