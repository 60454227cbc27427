import { SourceSans3_400Regular } from '@expo-google-fonts/source-sans-3';
import { Line, useFont, vec } from '@shopify/react-native-skia';
import { View } from 'react-native';
import { Bar, CartesianChart } from 'victory-native';
import { colors } from '../theme';
import type { ChartBar } from './chart-data';

/**
 * Treated char length by rank, bars with 95 % interval whiskers. Loaded only where a chart is
 * drawn: on the web through ranking-chart.web.tsx, so CanvasKit never loads with other routes.
 */
export default function RankingChartView({ bars }: { bars: ChartBar[] }) {
  const font = useFont(SourceSans3_400Regular, 13);
  const top = Math.max(10, ...bars.map((b) => b.hi)) * 1.1;
  return (
    <View style={{ height: 260 }} testID="ranking-chart">
      <CartesianChart
        data={bars}
        xKey="x"
        yKeys={['mean']}
        domain={{ y: [0, top] }}
        domainPadding={{ left: 60, right: 60, top: 10 }}
        axisOptions={{
          font,
          tickCount: { x: bars.length, y: 5 },
          formatXLabel: (x) => `#${bars.find((b) => b.x === x)?.label ?? ''}`,
          formatYLabel: (y) => `${Math.round(Number(y))} mm`,
          labelColor: colors.ink,
          lineColor: colors.line,
        }}
      >
        {({ points, chartBounds, yScale }) => (
          <>
            <Bar
              points={points.mean}
              chartBounds={chartBounds}
              color={colors.primary}
              barWidth={36}
              roundedCorners={{ topLeft: 4, topRight: 4 }}
            />
            {points.mean.map((p, i) => {
              const bar = bars[i]!;
              return (
                <Line
                  key={bar.x}
                  p1={vec(p.x, yScale(bar.lo))}
                  p2={vec(p.x, yScale(bar.hi))}
                  color={colors.ink}
                  strokeWidth={2}
                />
              );
            })}
          </>
        )}
      </CartesianChart>
    </View>
  );
}
