import type { TreatmentStatsOutput } from '../../shared/schemas/ranking';
import { chartBars } from './chart-data';
import RankingChartView from './ranking-chart-view';

export function RankingChart({ treatments }: { treatments: TreatmentStatsOutput[] }) {
  return <RankingChartView bars={chartBars(treatments)} />;
}
