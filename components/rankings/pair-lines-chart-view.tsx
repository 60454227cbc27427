import { SourceSans3_400Regular } from '@expo-google-fonts/source-sans-3';
import { useFont } from '@shopify/react-native-skia';
import { Fragment } from 'react';
import { View } from 'react-native';
import { CartesianChart, Line, Scatter } from 'victory-native';
import { colors } from '../theme';
import type { PairLines } from './treatment-chart-data';

/**
 * One line per pair from its control char length to its treated one. Loaded only where it is
 * drawn: on the web through pair-lines-chart.web.tsx, so CanvasKit never loads with other routes.
 */
export default function PairLinesChartView({ lines }: { lines: PairLines }) {
  const font = useFont(SourceSans3_400Regular, 13);
  return (
    <View style={{ height: 280 }} testID="pair-lines-chart">
      <CartesianChart
        data={lines.rows}
        xKey="x"
        yKeys={lines.keys}
        domain={{ x: [0, 1], y: [0, lines.top] }}
        domainPadding={{ left: 56, right: 56, top: 10 }}
        axisOptions={{
          font,
          // d3 puts ticks at 0 and 1 only when asked for one step.
          tickCount: { x: 1, y: 5 },
          formatXLabel: (x) => (Number(x) === 0 ? 'Control' : Number(x) === 1 ? 'Treated' : ''),
          formatYLabel: (y) => `${Math.round(Number(y))} mm`,
          labelColor: colors.ink,
          lineColor: colors.line,
        }}
      >
        {({ points }) =>
          lines.keys.map((key) => (
            <Fragment key={key}>
              <Line points={points[key]!} color={colors.primary} strokeWidth={2} />
              <Scatter points={points[key]!} radius={4} color={colors.ink} />
            </Fragment>
          ))
        }
      </CartesianChart>
    </View>
  );
}
