import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatNumber } from '../../../lib/format.ts';
import { axisStyle, ChartFrame, colors } from './chart-kit.tsx';

interface Point {
  minute: number;
  socPct: number;
  currentA: number;
  voltageV: number;
}

/** The charge profile: state of charge and current over time, and the pack voltage. */
export default function ChargeProfileChart({ profile }: { profile: Point[] }) {
  const data = profile.map((p) => ({ ...p, hours: p.minute / 60 }));
  const columns = [
    { label: 'Time (h)', value: (p: (typeof data)[number]) => p.hours },
    { label: 'SoC (%)', value: (p: (typeof data)[number]) => p.socPct },
    { label: 'Current (A)', value: (p: (typeof data)[number]) => p.currentA },
    { label: 'Voltage (V)', value: (p: (typeof data)[number]) => p.voltageV },
  ];
  return (
    <div className="grid gap-4 xl:grid-cols-2">
      <ChartFrame title="Charge profile" description="State of charge (left axis) and charge current (right axis) over time: constant current, then the taper." rows={data} columns={columns}>
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={data} margin={{ top: 8, right: 8, bottom: 16, left: 0 }}>
            <CartesianGrid stroke={colors.grid} strokeDasharray="3 3" />
            <XAxis dataKey="hours" type="number" domain={[0, 'dataMax']} tick={axisStyle} tickFormatter={(v: number) => formatNumber(v)} label={{ value: 'hours', position: 'insideBottom', offset: -8, ...axisStyle }} />
            <YAxis yAxisId="soc" domain={[0, 100]} tick={axisStyle} unit="%" width={48} />
            <YAxis yAxisId="a" orientation="right" tick={axisStyle} unit=" A" width={56} />
            <Tooltip formatter={(v) => formatNumber(Number(v))} labelFormatter={(v) => `${formatNumber(Number(v))} h`} />
            <Legend verticalAlign="top" height={28} />
            <Line yAxisId="soc" type="monotone" dataKey="socPct" name="State of charge (%)" stroke={colors.copper} strokeWidth={2} dot={false} isAnimationActive={false} />
            <Line yAxisId="a" type="stepAfter" dataKey="currentA" name="Current (A)" stroke={colors.blue} strokeWidth={2} strokeDasharray="6 3" dot={false} isAnimationActive={false} />
          </LineChart>
        </ResponsiveContainer>
      </ChartFrame>
      <ChartFrame title="Pack voltage while charging" description="Terminal voltage: open-circuit voltage plus the current through the resistance, then held at the charge voltage." rows={data} columns={columns}>
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={data} margin={{ top: 8, right: 8, bottom: 16, left: 0 }}>
            <CartesianGrid stroke={colors.grid} strokeDasharray="3 3" />
            <XAxis dataKey="hours" type="number" domain={[0, 'dataMax']} tick={axisStyle} tickFormatter={(v: number) => formatNumber(v)} label={{ value: 'hours', position: 'insideBottom', offset: -8, ...axisStyle }} />
            <YAxis domain={['auto', 'auto']} tick={axisStyle} unit=" V" width={64} />
            <Tooltip formatter={(v) => formatNumber(Number(v))} labelFormatter={(v) => `${formatNumber(Number(v))} h`} />
            <Line type="monotone" dataKey="voltageV" name="Voltage (V)" stroke={colors.graphite} strokeWidth={2} dot={false} isAnimationActive={false} />
          </LineChart>
        </ResponsiveContainer>
      </ChartFrame>
    </div>
  );
}
