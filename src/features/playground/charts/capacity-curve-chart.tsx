import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatNumber } from '../../../lib/format.ts';
import { axisStyle, ChartFrame, colors, downsample } from './chart-kit.tsx';

interface Sample {
  tS: number;
  currentA: number;
  voltageV?: number;
}

/** The discharge curve of an uploaded capacity-test log: voltage and current over time. */
export default function CapacityCurveChart({ samples }: { samples: Sample[] }) {
  const t0 = samples[0]?.tS ?? 0;
  const data = downsample(samples, 600).map((s) => ({ hours: (s.tS - t0) / 3600, currentA: Math.abs(s.currentA), voltageV: s.voltageV }));
  const hasVoltage = data.some((d) => d.voltageV !== undefined);
  return (
    <ChartFrame
      title="Discharge curve from the log"
      description={`${samples.length.toLocaleString('en-US')} samples: ${hasVoltage ? 'pack voltage (left axis) and ' : ''}discharge current (right axis) over time.`}
      rows={data}
      columns={[
        { label: 'Time (h)', value: (d) => d.hours },
        { label: 'Current (A)', value: (d) => d.currentA },
        { label: 'Voltage (V)', value: (d) => d.voltageV },
      ]}
    >
      <ResponsiveContainer width="100%" height="100%">
        <LineChart data={data} margin={{ top: 8, right: 8, bottom: 16, left: 0 }}>
          <CartesianGrid stroke={colors.grid} strokeDasharray="3 3" />
          <XAxis dataKey="hours" type="number" domain={[0, 'dataMax']} tick={axisStyle} tickFormatter={(v: number) => formatNumber(v)} label={{ value: 'hours', position: 'insideBottom', offset: -8, ...axisStyle }} />
          {hasVoltage ? <YAxis yAxisId="v" tick={axisStyle} unit=" V" width={64} domain={['auto', 'auto']} /> : null}
          <YAxis yAxisId="a" orientation="right" tick={axisStyle} unit=" A" width={56} domain={[0, 'auto']} />
          <Tooltip formatter={(v) => formatNumber(Number(v))} labelFormatter={(v) => `${formatNumber(Number(v))} h`} />
          <Legend verticalAlign="top" height={28} />
          {hasVoltage ? <Line yAxisId="v" type="monotone" dataKey="voltageV" name="Voltage (V)" stroke={colors.graphite} strokeWidth={2} dot={false} isAnimationActive={false} /> : null}
          <Line yAxisId="a" type="stepAfter" dataKey="currentA" name="Current (A)" stroke={colors.copper} strokeWidth={2} strokeDasharray="6 3" dot={false} isAnimationActive={false} />
        </LineChart>
      </ResponsiveContainer>
    </ChartFrame>
  );
}
