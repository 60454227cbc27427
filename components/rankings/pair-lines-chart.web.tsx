import { WithSkiaWeb } from '@shopify/react-native-skia/lib/module/web';
import { AppText } from '../ui/text';
import type { PairLines } from './treatment-chart-data';

// CanvasKit loads here, when the chart is drawn, from the site root (see ranking-chart.web.tsx).
export function PairLinesChart({ lines }: { lines: PairLines }) {
  return (
    <WithSkiaWeb
      getComponent={() => import('./pair-lines-chart-view')}
      opts={{ locateFile: (file: string) => `/${file}` }}
      componentProps={{ lines }}
      fallback={<AppText tone="muted">Drawing the chart…</AppText>}
    />
  );
}
