import type { DifferenceDots } from './treatment-chart-data';
import DifferenceChartView from './difference-chart-view';

export function DifferenceChart({ plot }: { plot: DifferenceDots }) {
  return <DifferenceChartView plot={plot} />;
}
