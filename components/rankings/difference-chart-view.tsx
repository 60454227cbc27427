import { SourceSans3_400Regular } from '@expo-google-fonts/source-sans-3';
import { DashPathEffect, Line as SkiaLine, Rect, useFont, vec } from '@shopify/react-native-skia';
import { View } from 'react-native';
import { CartesianChart, Scatter } from 'victory-native';
import { colors } from '../theme';
import type { DifferenceDots } from './treatment-chart-data';

/**
 * Each pair's difference (control − treated) as a dot, the mean as a line, its 95 % interval as
 * a band and zero as a dashed line. Loaded only where it is drawn (difference-chart.web.tsx).
 */
export default function DifferenceChartView({ plot }: { plot: DifferenceDots }) {
  const font = useFont(SourceSans3_400Regular, 13);
  const n = plot.count;
  return (
    <View style={{ height: 280 }} testID="difference-chart">
      <CartesianChart
        data={plot.dots}
        xKey="x"
        yKeys={['diff']}
        domain={{ x: [0, n + 1], y: [plot.lo, plot.hi] }}
        axisOptions={{
          font,
          tickCount: { x: Math.min(n + 2, 8), y: 6 },
          formatXLabel: (x) => (x >= 1 && x <= n && Number.isInteger(x) ? `${x}` : ''),
          formatYLabel: (y) => `${Math.round(Number(y))} mm`,
          labelColor: colors.ink,
          lineColor: colors.line,
        }}
      >
        {({ points, chartBounds, yScale }) => {
          const across = (y: number) => [vec(chartBounds.left, y), vec(chartBounds.right, y)];
          const [zeroFrom, zeroTo] = across(yScale(0));
          return (
            <>
              {plot.ci95 ? (
                <Rect
                  x={chartBounds.left}
                  y={yScale(plot.ci95[1])}
                  width={chartBounds.right - chartBounds.left}
                  height={yScale(plot.ci95[0]) - yScale(plot.ci95[1])}
                  color={colors.primary}
                  opacity={0.18}
                />
              ) : null}
              <SkiaLine p1={zeroFrom!} p2={zeroTo!} color={colors.muted} strokeWidth={1.5}>
                <DashPathEffect intervals={[6, 5]} />
              </SkiaLine>
              {plot.mean !== null ? (
                <SkiaLine
                  p1={across(yScale(plot.mean))[0]!}
                  p2={across(yScale(plot.mean))[1]!}
                  color={colors.primary}
                  strokeWidth={2.5}
                />
              ) : null}
              <Scatter points={points.diff} radius={5} color={colors.ink} />
            </>
          );
        }}
      </CartesianChart>
    </View>
  );
}
