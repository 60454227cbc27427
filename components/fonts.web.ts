/**
 * On the web the faces are @font-face rules in public/index.html, preloaded with the scripts and
 * shown with font-display: swap, so nothing waits for them and expo-font stays out of the first
 * load.
 */
export function useAppFonts(): boolean {
  return true;
}
