import { Bar, BarChart, CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatNumber } from '../../../lib/format.ts';
import { axisStyle, ChartFrame, colors } from './chart-kit.tsx';

interface PackShare {
  label: string;
  currentA: number;
  sharePct: number;
  limitA?: number;
}

interface TimelinePoint {
  tS: number;
  busVoltageV: number;
  loadCurrentA: number;
  packs: Array<{ currentA: number; stateOfChargePct: number }>;
}

const series = [colors.copper, colors.blue, colors.green, colors.graphite, colors.warn, colors.danger, '#6b4c8a', '#3d6e6e'];

/** The load share between parallel packs: each pack's current beside its continuous limit, and the timeline when asked. */
export default function LoadShareChart({ packs, timeline }: { packs: PackShare[]; timeline?: TimelinePoint[] }) {
  const hasLimits = packs.some((p) => p.limitA !== undefined);
  const rows = timeline?.map((t) => ({
    hours: t.tS / 3600,
    busVoltageV: t.busVoltageV,
    ...Object.fromEntries(t.packs.flatMap((p, i) => [[`current${i}`, p.currentA], [`soc${i}`, p.stateOfChargePct]])),
  }));
  type Row = NonNullable<typeof rows>[number];
  return (
    <div className="grid gap-4 xl:grid-cols-2">
      <ChartFrame
        title="Load share"
        description={`Current out of each pack${hasLimits ? ', beside its continuous discharge limit' : ''}. Uneven resistance or state of charge makes the share uneven.`}
        rows={packs}
        columns={[
          { label: 'Pack', value: (p) => p.label },
          { label: 'Current (A)', value: (p) => p.currentA },
          { label: 'Share (%)', value: (p) => p.sharePct },
          { label: 'Limit (A)', value: (p) => p.limitA },
        ]}
      >
        <ResponsiveContainer width="100%" height="100%">
          <BarChart data={packs} margin={{ top: 8, right: 8, bottom: 8, left: 0 }}>
            <CartesianGrid stroke={colors.grid} strokeDasharray="3 3" vertical={false} />
            <XAxis dataKey="label" tick={{ ...axisStyle, fontFamily: 'Inter, sans-serif' }} />
            <YAxis tick={axisStyle} unit=" A" width={64} />
            <Tooltip formatter={(v) => formatNumber(Number(v))} />
            <Legend verticalAlign="top" height={28} />
            <Bar dataKey="currentA" name="Current (A)" fill={colors.copper} isAnimationActive={false} />
            {hasLimits ? <Bar dataKey="limitA" name="Continuous limit (A)" fill={colors.failing} isAnimationActive={false} /> : null}
          </BarChart>
        </ResponsiveContainer>
      </ChartFrame>
      {rows && rows.length > 0 ? (
        <ChartFrame
          title="Discharge timeline"
          description="Each pack's current over time until the first pack reaches its cut-off."
          rows={rows}
          columns={[
            { label: 'Time (h)', value: (r: Row) => r.hours },
            { label: 'Bus (V)', value: (r: Row) => r.busVoltageV },
            ...packs.map((p, i) => ({ label: `${p.label} (A)`, value: (r: Row) => (r as Record<string, number>)[`current${i}`] })),
            ...packs.map((p, i) => ({ label: `${p.label} SoC (%)`, value: (r: Row) => (r as Record<string, number>)[`soc${i}`] })),
          ]}
        >
          <ResponsiveContainer width="100%" height="100%">
            <LineChart data={rows} margin={{ top: 8, right: 8, bottom: 16, left: 0 }}>
              <CartesianGrid stroke={colors.grid} strokeDasharray="3 3" />
              <XAxis dataKey="hours" type="number" domain={[0, 'dataMax']} tick={axisStyle} tickFormatter={(v: number) => formatNumber(v)} label={{ value: 'hours', position: 'insideBottom', offset: -8, ...axisStyle }} />
              <YAxis yAxisId="a" tick={axisStyle} unit=" A" width={64} />
              <YAxis yAxisId="soc" orientation="right" domain={[0, 100]} tick={axisStyle} unit="%" width={48} />
              <Tooltip formatter={(v) => formatNumber(Number(v))} labelFormatter={(v) => `${formatNumber(Number(v))} h`} />
              <Legend verticalAlign="top" height={28} />
              {packs.map((p, i) => (
                <Line key={`c${i}`} yAxisId="a" type="monotone" dataKey={`current${i}`} name={`${p.label} current (A)`} stroke={series[i % series.length]} strokeWidth={2} dot={false} isAnimationActive={false} />
              ))}
              {packs.map((p, i) => (
                <Line key={`s${i}`} yAxisId="soc" type="monotone" dataKey={`soc${i}`} name={`${p.label} SoC (%)`} stroke={series[i % series.length]} strokeDasharray="5 4" dot={false} isAnimationActive={false} />
              ))}
            </LineChart>
          </ResponsiveContainer>
        </ChartFrame>
      ) : null}
    </div>
  );
}
