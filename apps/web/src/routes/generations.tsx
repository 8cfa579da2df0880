import { useQuery } from '@tanstack/react-query';
import { Link, useSearchParams } from 'react-router';
import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { planningQueries } from '../api/planning/queries';
import { Card, EmptyState, Loading, Notice, PageHeader } from '../components';

/** Attenuation and lag by generation: a strain drifting or tiring shows here. Lazy route (recharts). */
export function Component() {
  const [params] = useSearchParams();
  const scope = { cultureId: params.get('cultureId') ?? undefined, strain: params.get('strain') ?? undefined };
  const q = useQuery(planningQueries.generations(scope));
  if (q.isPending) return <Loading label="Loading batches" />;
  if (q.isError) return <Notice tone="danger" title={q.error.message} />;
  const { points, scope: s } = q.data;
  const data = points.map((p) => ({
    generation: p.generation,
    attenuation: p.apparentAttenuation == null ? null : Number(p.apparentAttenuation.toFixed(1)),
    lag: p.lagHours,
    name: p.batchName,
  }));
  return (
    <>
      <PageHeader
        title={`By generation: ${s.label}`}
        description={
          s.kind === 'lineage'
            ? 'Every batch pitched from this lineage.'
            : 'Every batch pitched with a culture of this strain.'
        }
      />
      {points.length === 0 ? (
        <EmptyState title="No batches yet">
          Batches pitched from this yeast appear here with their attenuation and lag.
        </EmptyState>
      ) : (
        <div className="space-y-5">
          <Card className="h-80 p-2 sm:p-4" data-testid="generation-chart">
            <ResponsiveContainer width="100%" height="100%">
              <LineChart data={data} margin={{ top: 10, right: 10, bottom: 20, left: 0 }}>
                <CartesianGrid stroke="var(--color-rule)" strokeDasharray="3 3" />
                <XAxis
                  dataKey="generation"
                  type="number"
                  allowDecimals={false}
                  label={{ value: 'generation', position: 'insideBottom', offset: -10 }}
                />
                <YAxis yAxisId="att" domain={[0, 100]} unit="%" />
                <YAxis yAxisId="lag" orientation="right" unit=" h" />
                <Tooltip />
                <Legend verticalAlign="top" />
                <Line
                  yAxisId="att"
                  dataKey="attenuation"
                  name="Apparent attenuation (%)"
                  stroke="var(--color-accent)"
                  strokeWidth={2}
                  dot={{ r: 4 }}
                  connectNulls
                />
                <Line
                  yAxisId="lag"
                  dataKey="lag"
                  name="Lag (hours)"
                  stroke="var(--color-warn)"
                  strokeDasharray="6 3"
                  strokeWidth={2}
                  dot={{ r: 4, strokeWidth: 2 }}
                  connectNulls
                />
              </LineChart>
            </ResponsiveContainer>
          </Card>
          <Card>
            <table className="w-full text-left">
              <caption className="sr-only">Batches by generation</caption>
              <thead>
                <tr className="text-sm text-ink-muted">
                  <th className="py-1 pr-2">Generation</th>
                  <th className="py-1 pr-2">Batch</th>
                  <th className="py-1 pr-2">Attenuation</th>
                  <th className="py-1">Lag</th>
                </tr>
              </thead>
              <tbody>
                {points.map((p) => (
                  <tr key={`${p.batchId}-${p.cultureId}`} className="border-t border-rule">
                    <td className="num py-1 pr-2">{p.generation}</td>
                    <td className="py-1 pr-2">
                      <Link className="text-accent underline" to={`/batches/${p.batchId}`}>
                        {p.batchName}
                      </Link>
                    </td>
                    <td className="num py-1 pr-2">
                      {p.apparentAttenuation == null ? '—' : `${p.apparentAttenuation.toFixed(1)}%`}
                    </td>
                    <td className="num py-1">{p.lagHours == null ? '—' : `${p.lagHours} h`}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </Card>
          <p className="text-sm text-ink-muted">
            Attenuation falling or lag growing from one generation to the next suggests tired or drifting yeast; go back
            to an earlier, cleaner generation. Past 5 repitches, watch closely.
          </p>
        </div>
      )}
    </>
  );
}
