import { Bar, BarChart, CartesianGrid, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';

/** Calls per day of the month as bars (loaded on demand: the charting library is its own chunk). */
export default function CallsByDayChart({ days }: { days: Array<{ date: string; calls: number }> }) {
  return (
    <div className="h-64 w-full" role="img" aria-label={`Calls per day: ${days.map((d) => `${d.date} ${d.calls}`).join(', ') || 'none'}`}>
      <ResponsiveContainer>
        <BarChart data={days} margin={{ top: 8, right: 8, bottom: 8, left: 8 }}>
          <CartesianGrid stroke="#ddd5c8" vertical={false} />
          <XAxis dataKey="date" tickFormatter={(d: string) => d.slice(8)} stroke="#57534d" fontSize={12} />
          <YAxis allowDecimals={false} stroke="#57534d" fontSize={12} width={48} />
          <Tooltip formatter={(v) => [String(v), 'calls']} labelFormatter={(l) => String(l)} />
          <Bar dataKey="calls" fill="#a85a23" radius={[3, 3, 0, 0]} isAnimationActive={false} />
        </BarChart>
      </ResponsiveContainer>
    </div>
  );
}
