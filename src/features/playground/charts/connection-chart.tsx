import { CartesianGrid, Legend, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatNumber } from '../../../lib/format.ts';
import { axisStyle, ChartFrame, colors } from './chart-kit.tsx';

interface Point {
  tS: number;
  currentA: number;
  socAPct: number;
  socBPct: number;
}

/** The connection timeline: the equalizing current against the packs' limits, and both states of charge. */
export default function ConnectionChart({
  timeline,
  peakLimitA,
  continuousLimitA,
  labelA,
  labelB,
}: {
  timeline: Point[];
  peakLimitA: number | null;
  continuousLimitA: number | null;
  labelA: string;
  labelB: string;
}) {
  // The current is positive from A into B; draw the limits on the side the current flows.
  const sign = (timeline[0]?.currentA ?? 0) < 0 ? -1 : 1;
  const columns = [
    { label: 'Time (s)', value: (p: Point) => p.tS },
    { label: 'Current (A)', value: (p: Point) => p.currentA },
    { label: `${labelA} SoC (%)`, value: (p: Point) => p.socAPct },
    { label: `${labelB} SoC (%)`, value: (p: Point) => p.socBPct },
  ];
  const xAxis = <XAxis dataKey="tS" type="number" domain={[0, 'dataMax']} tick={axisStyle} tickFormatter={(v: number) => formatNumber(v)} label={{ value: 'seconds', position: 'insideBottom', offset: -8, ...axisStyle }} />;
  return (
    <div className="grid gap-4 xl:grid-cols-2">
      <ChartFrame
        title="Connection current"
        description={`Current from ${labelA} into ${labelB} after the switch closes, with the packs' peak and continuous limits drawn (dashed).`}
        rows={timeline}
        columns={columns}
      >
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={timeline} margin={{ top: 8, right: 16, bottom: 16, left: 0 }}>
            <CartesianGrid stroke={colors.grid} strokeDasharray="3 3" />
            {xAxis}
            <YAxis tick={axisStyle} unit=" A" width={72} domain={sign > 0 ? [0, 'auto'] : ['auto', 0]} />
            <Tooltip formatter={(v) => formatNumber(Number(v))} labelFormatter={(v) => `${formatNumber(Number(v))} s`} />
            <Legend verticalAlign="top" height={28} />
            {peakLimitA !== null ? (
              <ReferenceLine y={sign * peakLimitA} stroke={colors.danger} strokeDasharray="6 4" ifOverflow="extendDomain" label={{ value: `peak limit ${formatNumber(peakLimitA)} A`, position: 'insideTopRight', fill: colors.danger, fontSize: 12 }} />
            ) : null}
            {continuousLimitA !== null ? (
              <ReferenceLine y={sign * continuousLimitA} stroke={colors.warn} strokeDasharray="3 3" ifOverflow="extendDomain" label={{ value: `continuous limit ${formatNumber(continuousLimitA)} A`, position: 'insideBottomRight', fill: colors.warn, fontSize: 12 }} />
            ) : null}
            <Line type="monotone" dataKey="currentA" name="Current (A)" stroke={colors.copper} strokeWidth={2} dot={false} isAnimationActive={false} />
          </LineChart>
        </ResponsiveContainer>
      </ChartFrame>
      <ChartFrame title="States of charge" description="Both packs' states of charge moving together as they equalize." rows={timeline} columns={columns}>
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={timeline} margin={{ top: 8, right: 16, bottom: 16, left: 0 }}>
            <CartesianGrid stroke={colors.grid} strokeDasharray="3 3" />
            {xAxis}
            <YAxis tick={axisStyle} unit="%" width={56} domain={['auto', 'auto']} />
            <Tooltip formatter={(v) => formatNumber(Number(v))} labelFormatter={(v) => `${formatNumber(Number(v))} s`} />
            <Legend verticalAlign="top" height={28} />
            <Line type="monotone" dataKey="socAPct" name={`${labelA} (%)`} stroke={colors.blue} strokeWidth={2} dot={false} isAnimationActive={false} />
            <Line type="monotone" dataKey="socBPct" name={`${labelB} (%)`} stroke={colors.green} strokeWidth={2} strokeDasharray="6 3" dot={false} isAnimationActive={false} />
          </LineChart>
        </ResponsiveContainer>
      </ChartFrame>
    </div>
  );
}
