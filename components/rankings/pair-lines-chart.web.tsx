import { lazySkiaView } from '../ui/skia-web';
import { AppText } from '../ui/text';
import type { PairLines } from './treatment-chart-data';

// CanvasKit and the chart load here, when the chart is drawn (see lazySkiaView).
const ChartView = lazySkiaView(
  () => import('./chart-views'),
  (views) => views.PairLinesChartView,
);

export function PairLinesChart({ lines }: { lines: PairLines }) {
  return <ChartView lines={lines} fallback={<AppText tone="muted">Drawing the chart…</AppText>} />;
}
