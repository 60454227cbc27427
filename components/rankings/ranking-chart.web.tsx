import type { TreatmentStatsOutput } from '../../shared/schemas/ranking';
import { lazySkiaView } from '../ui/skia-web';
import { AppText } from '../ui/text';
import { chartBars } from './chart-data';

// CanvasKit (8 MB) and the chart load here, when a chart is drawn.
const ChartView = lazySkiaView(
  () => import('./chart-views'),
  (views) => views.RankingChartView,
);

export function RankingChart({ treatments }: { treatments: TreatmentStatsOutput[] }) {
  return (
    <ChartView
      bars={chartBars(treatments)}
      fallback={<AppText tone="muted">Drawing the chart…</AppText>}
    />
  );
}
