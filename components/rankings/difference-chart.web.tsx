import { WithSkiaWeb } from '@shopify/react-native-skia/lib/module/web';
import { AppText } from '../ui/text';
import type { DifferenceDots } from './treatment-chart-data';

// CanvasKit loads here, when the chart is drawn, from the site root (see ranking-chart.web.tsx).
export function DifferenceChart({ plot }: { plot: DifferenceDots }) {
  return (
    <WithSkiaWeb
      getComponent={() => import('./difference-chart-view')}
      opts={{ locateFile: (file: string) => `/${file}` }}
      componentProps={{ plot }}
      fallback={<AppText tone="muted">Drawing the chart…</AppText>}
    />
  );
}
