import { Bar, BarChart, CartesianGrid, Cell, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatNumber } from '../../../lib/format.ts';
import { axisStyle, ChartFrame, colors } from './chart-kit.tsx';

interface Candidate {
  size: string;
  deratedAmpacityA: number | null;
  voltageDropPct: number;
  passes: boolean;
}

/** The wire candidates: voltage drop and derated ampacity per size, against the limits. */
export default function WireCandidatesChart({
  candidates,
  maxVoltageDropPct,
  requiredAmpacityA,
  recommended,
}: {
  candidates: Candidate[];
  maxVoltageDropPct: number;
  requiredAmpacityA: number;
  recommended: string | null;
}) {
  const columns = [
    { label: 'Size', value: (c: Candidate) => c.size },
    { label: 'Voltage drop (%)', value: (c: Candidate) => c.voltageDropPct },
    { label: 'Derated ampacity (A)', value: (c: Candidate) => c.deratedAmpacityA },
    { label: 'Passes', value: (c: Candidate) => (c.passes ? 'yes' : 'no') },
  ];
  // Recommended: copper; other passing sizes: green; failing sizes: grey (each ≥ 3:1 against the white plot).
  const fill = (c: Candidate) => (c.size === recommended ? colors.copper : c.passes ? colors.passing : colors.failing);
  const sizeAxis = <XAxis dataKey="size" tick={{ ...axisStyle, fontSize: 11 }} interval={0} angle={-40} textAnchor="end" height={56} />;
  return (
    <div className="grid gap-4 xl:grid-cols-2">
      <ChartFrame
        title="Voltage drop by size"
        description={`Round-trip drop in % of the system voltage; the dashed line is the ${formatNumber(maxVoltageDropPct)} % limit. The recommended size is in copper, other passing sizes in green, failing ones in grey.`}
        rows={candidates}
        columns={columns}
      >
        <ResponsiveContainer width="100%" height="100%">
          <BarChart data={candidates} margin={{ top: 8, right: 8, bottom: 8, left: 0 }}>
            <CartesianGrid stroke={colors.grid} strokeDasharray="3 3" vertical={false} />
            {sizeAxis}
            <YAxis tick={axisStyle} unit="%" width={56} scale="log" domain={['auto', 'auto']} allowDataOverflow />
            <Tooltip formatter={(v) => `${formatNumber(Number(v))} %`} />
            <ReferenceLine y={maxVoltageDropPct} stroke={colors.danger} strokeDasharray="6 4" label={{ value: `limit ${formatNumber(maxVoltageDropPct)} %`, position: 'insideTopRight', fill: colors.danger, fontSize: 12 }} />
            <Bar dataKey="voltageDropPct" name="Voltage drop (%)" isAnimationActive={false}>
              {candidates.map((c) => (
                <Cell key={c.size} fill={fill(c)} />
              ))}
            </Bar>
          </BarChart>
        </ResponsiveContainer>
      </ChartFrame>
      <ChartFrame
        title="Ampacity by size"
        description={`Ampacity after ambient and bundling corrections; the dashed line is the ${formatNumber(requiredAmpacityA)} A the current needs.`}
        rows={candidates}
        columns={columns}
      >
        <ResponsiveContainer width="100%" height="100%">
          <BarChart data={candidates} margin={{ top: 8, right: 8, bottom: 8, left: 0 }}>
            <CartesianGrid stroke={colors.grid} strokeDasharray="3 3" vertical={false} />
            {sizeAxis}
            <YAxis tick={axisStyle} unit=" A" width={64} />
            <Tooltip formatter={(v) => `${formatNumber(Number(v))} A`} />
            <ReferenceLine y={requiredAmpacityA} stroke={colors.danger} strokeDasharray="6 4" ifOverflow="extendDomain" label={{ value: `needs ${formatNumber(requiredAmpacityA)} A`, position: 'insideTopLeft', fill: colors.danger, fontSize: 12 }} />
            <Bar dataKey="deratedAmpacityA" name="Derated ampacity (A)" isAnimationActive={false}>
              {candidates.map((c) => (
                <Cell key={c.size} fill={fill(c)} />
              ))}
            </Bar>
          </BarChart>
        </ResponsiveContainer>
      </ChartFrame>
    </div>
  );
}
