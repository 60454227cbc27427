import { lazy, Suspense, type ComponentType, type ReactNode } from 'react';

/**
 * A Skia view for the web that loads everything it needs on first render: CanvasKit's wasm
 * (from the site root; scripts/web-build.ts copies it into public/), its JavaScript loader and
 * the module holding the view. Skia's own WithSkiaWeb imports that loader statically, which
 * puts it in every page's first load.
 *
 * Give every view the same module to load (components/rankings/chart-views.ts): when two lazy
 * chunks share code (Skia, victory-native), Expo's export moves it into a common chunk that
 * index.html loads up front.
 */
export function lazySkiaView<M, P extends object>(
  load: () => Promise<M>,
  pick: (loaded: M) => ComponentType<P>,
): ComponentType<P & { fallback: ReactNode }> {
  const View = lazy(async () => {
    const { LoadSkiaWeb } = await import('@shopify/react-native-skia/lib/module/web/LoadSkiaWeb');
    await LoadSkiaWeb({ locateFile: (file: string) => `/${file}` });
    return { default: pick(await load()) };
  });
  return function SkiaView({ fallback, ...props }: P & { fallback: ReactNode }) {
    return (
      <Suspense fallback={fallback}>
        <View {...(props as P)} />
      </Suspense>
    );
  };
}
