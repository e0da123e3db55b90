import { Area, AreaChart, CartesianGrid, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatMoney, type MrrPoint } from '@revloop/domain/billing';

const monthLabel = (month: string) => new Date(`${month}-01T00:00:00Z`).toLocaleDateString(undefined, { month: 'short', year: '2-digit', timeZone: 'UTC' });

/** Monthly recurring revenue at the end of each month (the current month up to today). */
export function MrrChart({ series, currency }: { series: MrrPoint[]; currency: string }) {
  const data = series.map((p) => ({ ...p, label: monthLabel(p.month) }));
  return (
    <figure>
      <div className="h-64 w-full">
        <ResponsiveContainer>
          <AreaChart data={data} margin={{ top: 8, right: 16, bottom: 0, left: 8 }}>
            <CartesianGrid strokeDasharray="3 3" stroke="var(--color-ink-200)" />
            <XAxis dataKey="label" tick={{ fontSize: 12 }} />
            <YAxis tick={{ fontSize: 12 }} width={64} tickFormatter={(v: number) => formatMoney(Math.round(v), currency).replace(/\.0+$/, '')} />
            <Tooltip formatter={(_v, _n, item) => [formatMoney((item.payload as MrrPoint).mrrMinor, currency), 'MRR']} />
            <Area type="stepAfter" isAnimationActive={false} dataKey="mrrMinor" stroke="var(--color-accent-600)" fill="var(--color-accent-100)" strokeWidth={2} />
          </AreaChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="sr-only">
        {data.map((p) => `${p.label}: ${formatMoney(p.mrrMinor, currency)}`).join('; ')}
      </figcaption>
    </figure>
  );
}
