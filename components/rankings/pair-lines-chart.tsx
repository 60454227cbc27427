import type { PairLines } from './treatment-chart-data';
import PairLinesChartView from './pair-lines-chart-view';

export function PairLinesChart({ lines }: { lines: PairLines }) {
  return <PairLinesChartView lines={lines} />;
}
