import { WithSkiaWeb } from '@shopify/react-native-skia/lib/module/web';
import type { TreatmentStatsOutput } from '../../shared/schemas/ranking';
import { AppText } from '../ui/text';
import { chartBars } from './chart-data';

// CanvasKit (8 MB) loads here, when a chart is drawn, and from the site root
// (scripts/web-build.ts copies canvaskit.wasm into public/).
export function RankingChart({ treatments }: { treatments: TreatmentStatsOutput[] }) {
  return (
    <WithSkiaWeb
      getComponent={() => import('./ranking-chart-view')}
      opts={{ locateFile: (file: string) => `/${file}` }}
      componentProps={{ bars: chartBars(treatments) }}
      fallback={<AppText tone="muted">Drawing the chart…</AppText>}
    />
  );
}
