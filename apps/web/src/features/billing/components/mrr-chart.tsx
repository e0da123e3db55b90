import { Area, AreaChart, CartesianGrid, Legend, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatMoney, type MrrPoint } from '@revloop/domain/billing';

const monthLabel = (month: string) => new Date(`${month}-01T00:00:00Z`).toLocaleDateString(undefined, { month: 'short', year: '2-digit', timeZone: 'UTC' });

/** Monthly recurring revenue at the end of each month (the current month up to today). */
export function MrrChart({ series, currency }: { series: MrrPoint[]; currency: string }) {
  const data = series.map((p) => ({ ...p, label: monthLabel(p.month) }));
  return (
    <figure>
      <div className="h-72 w-full">
        <ResponsiveContainer>
          <AreaChart data={data} margin={{ top: 8, right: 16, bottom: 0, left: 16 }}>
            <CartesianGrid strokeDasharray="3 3" stroke="var(--color-ink-200)" />
            <XAxis dataKey="label" tick={{ fontSize: 12 }} height={40} label={{ value: 'Month (end of month; this month to date)', position: 'insideBottom', fontSize: 12, fill: 'var(--color-ink-700)' }} />
            <YAxis
              tick={{ fontSize: 12 }}
              width={72}
              tickFormatter={(v: number) => formatMoney(Math.round(v), currency).replace(/\.0+$/, '')}
              label={{ value: `MRR (${currency.toUpperCase()} a month)`, angle: -90, position: 'insideLeft', fontSize: 12, fill: 'var(--color-ink-700)' }}
            />
            <Tooltip formatter={(_v, _n, item) => [formatMoney((item.payload as MrrPoint).mrrMinor, currency), 'MRR']} />
            <Legend verticalAlign="top" height={28} wrapperStyle={{ fontSize: 13 }} />
            <Area
              type="stepAfter"
              isAnimationActive={false}
              dataKey="mrrMinor"
              name={`Monthly recurring revenue (${currency.toUpperCase()})`}
              stroke="var(--color-accent-600)"
              fill="var(--color-accent-100)"
              strokeWidth={2}
            />
          </AreaChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="sr-only">
        {data.map((p) => `${p.label}: ${formatMoney(p.mrrMinor, currency)}`).join('; ')}
      </figcaption>
    </figure>
  );
}
