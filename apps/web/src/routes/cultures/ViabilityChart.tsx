import {
  CartesianGrid,
  Line,
  ReferenceLine,
  ResponsiveContainer,
  Scatter,
  Tooltip,
  XAxis,
  YAxis,
  ComposedChart,
} from 'recharts';
import type { HealthSeries } from '../../api/cultures/queries';

const day = (iso: string) => new Date(iso).getTime();
// built once: the axis formats every tick on every render
const dayMonth = new Intl.DateTimeFormat(undefined, { day: 'numeric', month: 'short' });
const fmt = (t: number) => dayMonth.format(new Date(t));

/** Projected viability over the coming weeks, with stain counts as points. Loaded only on the culture page. */
export default function ViabilityChart({ data }: { data: HealthSeries }) {
  const series = data.series.map((p) => ({ t: day(p.at), projected: Math.round(p.viability * 1000) / 10 }));
  const measured = data.measured.map((m) => ({ t: day(m.at), measured: Math.round(m.viability * 1000) / 10 }));
  const now = day(data.now);
  return (
    <figure className="space-y-2">
      <div className="h-56 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart margin={{ top: 20, right: 16, bottom: 0, left: -12 }}>
            <CartesianGrid stroke="var(--color-rule)" strokeDasharray="3 3" />
            <XAxis
              dataKey="t"
              type="number"
              scale="time"
              domain={['dataMin', 'dataMax']}
              tickFormatter={fmt}
              tickCount={5}
              stroke="var(--color-ink-muted)"
              fontSize={12}
              allowDuplicatedCategory={false}
            />
            <YAxis domain={[0, 100]} unit="%" stroke="var(--color-ink-muted)" fontSize={12} />
            <Tooltip
              labelFormatter={(t) => fmt(Number(t))}
              formatter={(v, name) => [`${v}%`, name === 'measured' ? 'stain count' : 'projected']}
            />
            <ReferenceLine
              x={now}
              stroke="var(--color-accent)"
              strokeDasharray="4 2"
              label={{ value: 'today', fontSize: 11, fill: 'var(--color-accent)', position: 'top' }}
            />
            <Line
              data={series}
              dataKey="projected"
              type="monotone"
              stroke="var(--color-accent)"
              strokeWidth={2}
              dot={false}
              isAnimationActive={false}
            />
            <Scatter
              data={measured}
              dataKey="measured"
              fill="var(--color-warn)"
              shape="diamond"
              isAnimationActive={false}
            />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-sm text-ink-muted">
        Line: projected viability. Diamonds: your stain counts. The projection is a model, not a measurement.
      </figcaption>
    </figure>
  );
}
