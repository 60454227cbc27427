import { lazySkiaView } from '../ui/skia-web';
import { AppText } from '../ui/text';
import type { DifferenceDots } from './treatment-chart-data';

// CanvasKit and the chart load here, when the chart is drawn (see lazySkiaView).
const ChartView = lazySkiaView(
  () => import('./chart-views'),
  (views) => views.DifferenceChartView,
);

export function DifferenceChart({ plot }: { plot: DifferenceDots }) {
  return <ChartView plot={plot} fallback={<AppText tone="muted">Drawing the chart…</AppText>} />;
}
