// Charts through react-native-gifted-charts (react-native-svg underneath, no eval, fine under our CSP).
// Each chart measures its frame so bars and labels fit the width it has: nothing scrolls sideways.
import { useState, type ReactNode } from 'react';
import { View } from 'react-native';
import { BarChart, LineChart } from 'react-native-gifted-charts';
import { useTheme } from '../theme/use-theme';
import { Row } from '../ui/surfaces';
import { Text } from '../ui/text';

const Y_AXIS = 34;
const HEIGHT = 180;
const LABEL_WIDTH = 52;

/** A frame that reports its inner width once laid out; the chart is drawn from then on. */
function Measured({ label, children }: { label: string; children: (width: number) => ReactNode }) {
  const [width, setWidth] = useState(0);
  return (
    <View role="img" aria-label={label} style={{ width: '100%', minHeight: HEIGHT + 40, overflow: 'hidden' }} onLayout={(e) => setWidth(Math.floor(e.nativeEvent.layout.width))}>
      {width > 0 ? children(width) : null}
    </View>
  );
}

/** A round top for the axis: 4 sections of whole steps. */
export function niceMax(max: number, floor = 4): number {
  const top = Math.max(floor, Math.ceil(max));
  const step = Math.ceil(top / 4);
  return step * 4;
}

export interface Bar {
  label: string;
  value: number;
  /** Shown above the bar, e.g. "4" or "12%". */
  display: string;
}

export function BarsChart({ bars, label, suffix = '', floor }: { bars: Bar[]; label: string; suffix?: string; floor?: number }) {
  const t = useTheme();
  const axisText = { color: t.colour.slate, fontSize: t.type.caption.fontSize, fontFamily: t.fonts.sans };
  return (
    <Measured label={label}>
      {(width) => {
        const plot = width - Y_AXIS - t.space.md;
        // gifted-charts lays out initialSpacing + n x (bar + spacing); n + 0.5 slots keep it inside.
        const slot = plot / (Math.max(bars.length, 1) + 0.5);
        const barWidth = Math.max(10, Math.min(40, Math.floor(slot * 0.6)));
        const spacing = Math.max(4, slot - barWidth);
        const max = niceMax(Math.max(0, ...bars.map((b) => b.value)), floor);
        return (
          <BarChart
            data={bars.map((b) => ({
              value: b.value,
              label: b.label,
              frontColor: t.colour.tide,
              topLabelContainerStyle: { width: slot, marginLeft: (barWidth - slot) / 2 },
              topLabelComponent: () => (
                <Text variant="caption" tone="ink" style={{ textAlign: 'center' }} numberOfLines={1}>
                  {b.display}
                </Text>
              ),
            }))}
            width={plot}
            height={HEIGHT}
            barWidth={barWidth}
            spacing={spacing}
            initialSpacing={spacing / 2}
            endSpacing={0}
            labelWidth={slot}
            maxValue={max}
            noOfSections={4}
            stepValue={max / 4}
            yAxisLabelWidth={Y_AXIS}
            yAxisLabelSuffix={suffix}
            yAxisTextStyle={axisText}
            xAxisLabelTextStyle={{ ...axisText, fontFamily: t.fonts.mono, width: slot, textAlign: 'center' }}
            xAxisColor={t.colour.line}
            yAxisColor={t.colour.line}
            rulesColor={t.colour.line}
            disableScroll
            disablePress
          />
        );
      }}
    </Measured>
  );
}

export interface TrendPoint {
  label: string;
  cases: number;
  comebacks: number;
}

/** Cases per week as a solid line, comebacks as a dashed one; the legend says which is which. */
export function TrendChart({ points, label }: { points: TrendPoint[]; label: string }) {
  const t = useTheme();
  const axisText = { color: t.colour.slate, fontSize: t.type.caption.fontSize, fontFamily: t.fonts.sans };
  // Room for about one date label per 56 px; the rest stay blank.
  return (
    <View style={{ gap: t.space.sm }}>
      <Row wrap style={{ gap: t.space.lg }}>
        <Row>
          <View style={{ width: 24, height: 3, backgroundColor: t.colour.tide }} />
          <Text variant="small">Cases</Text>
        </Row>
        <Row>
          <View style={{ width: 24, height: 0, borderTopWidth: 3, borderStyle: 'dashed', borderColor: t.colour.brick }} />
          <Text variant="small">Comebacks (dashed)</Text>
        </Row>
      </Row>
      <Measured label={label}>
        {(width) => {
          const plot = width - Y_AXIS - t.space.md;
          const n = Math.max(points.length, 2);
          // gifted-charts draws n slots of `spacing`, so divide by n to keep the last point inside.
          const spacing = (plot - 16) / n;
          const every = Math.max(1, Math.ceil(LABEL_WIDTH / spacing));
          const max = niceMax(Math.max(0, ...points.map((p) => p.cases)));
          const data = points.map((p) => ({ value: p.cases }));
          // Date labels drawn by us under the axis: the library squeezes them into one point's width.
          const labels = points.flatMap((p, i) => (i % every === 0 ? [{ text: p.label, left: Y_AXIS + 8 + i * spacing - 8 }] : []));
          return (
            <View>
            <LineChart
              data={data}
              data2={points.map((p) => ({ value: p.comebacks }))}
              width={plot}
              height={HEIGHT}
              spacing={spacing}
              initialSpacing={8}
              endSpacing={8}
              maxValue={max}
              noOfSections={4}
              stepValue={max / 4}
              color1={t.colour.tide}
              color2={t.colour.brick}
              dataPointsColor1={t.colour.tide}
              dataPointsColor2={t.colour.brick}
              strokeDashArray2={[6, 4]}
              thickness1={3}
              thickness2={3}
              yAxisLabelWidth={Y_AXIS}
              yAxisTextStyle={axisText}
              xAxisColor={t.colour.line}
              yAxisColor={t.colour.line}
              rulesColor={t.colour.line}
              disableScroll
              xAxisLabelsHeight={0}
            />
            <View style={{ height: 22, marginTop: 4 }}>
              {labels.map((l) => (
                <Text key={l.text + l.left} variant="caption" tone="slate" numberOfLines={1} style={{ position: 'absolute', left: Math.min(l.left, width - LABEL_WIDTH), width: LABEL_WIDTH }}>
                  {l.text}
                </Text>
              ))}
            </View>
            </View>
          );
        }}
      </Measured>
    </View>
  );
}
