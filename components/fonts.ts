import {
  SourceSans3_400Regular,
  SourceSans3_600SemiBold,
  SourceSans3_700Bold,
  useFonts,
} from '@expo-google-fonts/source-sans-3';
import { fontFaces } from './theme';

/**
 * On a phone the faces register with expo-font: true once they are ready or failed (the app then
 * runs in the system face). The web declares them in public/index.html instead (fonts.web.ts).
 */
export function useAppFonts(): boolean {
  const [loaded, error] = useFonts({
    [fontFaces.regular]: SourceSans3_400Regular,
    [fontFaces.semibold]: SourceSans3_600SemiBold,
    [fontFaces.bold]: SourceSans3_700Bold,
  });
  return loaded || Boolean(error);
}
