import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { useQuery } from '@tanstack/react-query';
import { Link, useParams } from 'react-router';
import { ChartLine, Sprout } from 'lucide-react';
import { platoFromSg } from '@barmkeep/core';
import type { BatchDto, UserDto } from '@barmkeep/schemas';
import { authQueries } from '../api/auth/queries';
import { planningQueries } from '../api/planning/queries';
import { useHarvestMutation, useUpdateBatchMutation } from '../api/planning/mutations';
import { isApiError } from '../api/client';
import { Button, Card, FormAlert, Loading, Notice, PageHeader, Select, TextField } from '../components';
import { formatBatchVolume, formatCells, formatWhen, sgFromInput } from '../lib/planningFormat';

const pct = (v: number | null) => (v == null ? '—' : `${v.toFixed(1)}%`);

function Results({ batch, user }: { batch: BatchDto; user: UserDto }) {
  const update = useUpdateBatchMutation(batch.id);
  const [error, setError] = useState<string | undefined>();
  const shown = (sg: number | null) =>
    sg == null ? '' : user.gravityUnit === 'plato' ? platoFromSg(sg).toFixed(1) : sg.toFixed(3);
  const { register, handleSubmit } = useForm({
    defaultValues: {
      fg: shown(batch.fgSg),
      lag: batch.lagHours?.toString() ?? '',
      temp: batch.fermentationTempC?.toString() ?? '',
    },
  });
  const n = (s: string) => (s.trim() === '' ? null : Number(s.replace(',', '.')));
  const onSubmit = handleSubmit(async (v) => {
    setError(undefined);
    const fg = n(v.fg);
    try {
      await update.mutateAsync({
        fgSg: fg == null ? null : sgFromInput(fg, user.gravityUnit),
        lagHours: n(v.lag),
        fermentationTempC: n(v.temp),
      });
    } catch (err) {
      setError(isApiError(err) ? Object.values(err.fields).flat().join(' ') || err.message : 'Could not save');
    }
  });
  const g = user.gravityUnit === 'plato' ? '°P' : 'SG';
  return (
    <Card className="space-y-4">
      <h2 className="text-lg font-semibold">Results</h2>
      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-4" data-testid="batch-derived">
        <div>
          <dt className="text-sm text-ink-muted">Alcohol</dt>
          <dd className="num font-medium">
            {batch.derived.abv == null ? '—' : `${batch.derived.abv.toFixed(1)}% ABV`}
          </dd>
        </div>
        <div>
          <dt className="text-sm text-ink-muted">Apparent attenuation</dt>
          <dd className="num font-medium">{pct(batch.derived.apparentAttenuation)}</dd>
        </div>
        <div>
          <dt className="text-sm text-ink-muted">Real attenuation</dt>
          <dd className="num font-medium">{pct(batch.derived.realAttenuation)}</dd>
        </div>
        <div>
          <dt className="text-sm text-ink-muted">Pitch rate</dt>
          <dd className="num font-medium">
            {batch.derived.pitchRate == null ? '—' : `${batch.derived.pitchRate.toFixed(2)} M/mL/°P`}
          </dd>
        </div>
      </dl>
      <form onSubmit={onSubmit} noValidate className="grid gap-3 sm:grid-cols-3" aria-label="Batch results">
        <TextField label={`Final gravity (${g})`} inputMode="decimal" {...register('fg')} />
        <TextField label="Lag time (hours)" inputMode="decimal" {...register('lag')} />
        <TextField label="Fermentation temperature (°C)" inputMode="decimal" {...register('temp')} />
        <div className="sm:col-span-3">
          <FormAlert message={error} />
          <Button type="submit" variant="secondary" busy={update.isPending}>
            Save results
          </Button>
        </div>
      </form>
      <p className="text-sm text-ink-muted">
        ABV by the Balling real-extract formula; attenuation from the gravity drop (see “The yeast math behind
        Barmkeep”, §9).
      </p>
    </Card>
  );
}

function Harvest({ batch }: { batch: BatchDto }) {
  const harvest = useHarvestMutation(batch.id);
  const [error, setError] = useState<string | undefined>();
  const [done, setDone] = useState<{ id: string; generation: number } | null>(null);
  const { register, handleSubmit } = useForm({
    defaultValues: {
      parentCultureId: batch.pitches[0]?.cultureId ?? '',
      form: 'slurry_unwashed',
      volumeMl: '',
      storageTempC: '3',
      location: '',
    },
  });
  const onSubmit = handleSubmit(async (v) => {
    setError(undefined);
    try {
      const r = await harvest.mutateAsync({
        parentCultureId: v.parentCultureId,
        form: v.form as 'slurry_unwashed' | 'slurry_washed',
        volumeMl: Number(v.volumeMl),
        storageTempC: Number(v.storageTempC),
        locationLabel: v.location,
      });
      setDone(r.culture);
    } catch (err) {
      setError(isApiError(err) ? Object.values(err.fields).flat().join(' ') || err.message : 'Could not save');
    }
  });
  return (
    <Card className="space-y-4">
      <h2 className="flex items-center gap-2 text-lg font-semibold">
        <Sprout aria-hidden className="size-5 text-accent" />
        Harvest slurry
      </h2>
      <p className="text-ink-muted">
        Keep yeast from this batch as a new culture, one generation on from the one you pitched.
      </p>
      {done ? (
        <Notice tone="success" live="polite" title={`saved as generation ${done.generation}`}>
          <Link className="text-accent underline" to={`/cultures/${done.id}`}>
            Open the new culture
          </Link>
        </Notice>
      ) : null}
      <form onSubmit={onSubmit} noValidate className="grid gap-3 sm:grid-cols-2" aria-label="Harvest slurry">
        <Select
          label="Pitched culture"
          options={batch.pitches.map((p) => ({
            value: p.cultureId,
            label: `${p.strainName} (generation ${p.generation})`,
          }))}
          {...register('parentCultureId')}
        />
        <Select
          label="Kept as"
          options={[
            { value: 'slurry_unwashed', label: 'Slurry under beer' },
            { value: 'slurry_washed', label: 'Washed slurry' },
          ]}
          {...register('form')}
        />
        <TextField label="Slurry volume (mL)" inputMode="decimal" {...register('volumeMl')} />
        <TextField label="Stored at (°C)" inputMode="decimal" {...register('storageTempC')} />
        <TextField label="Where it is kept" {...register('location')} />
        <div className="sm:col-span-2 space-y-2">
          <FormAlert message={error} />
          <p className="text-sm text-ink-muted">
            Leave the jar’s lid loose or vented: slurry keeps making gas in the fridge.
          </p>
          <Button type="submit" busy={harvest.isPending}>
            Save harvested slurry
          </Button>
        </div>
      </form>
    </Card>
  );
}

export function Component() {
  const { id = '' } = useParams();
  const me = useQuery(authQueries.me());
  const batch = useQuery(planningQueries.batch(id));
  if (batch.isPending || !me.data) return <Loading label="Loading the batch" />;
  if (batch.isError) return <Notice tone="danger" title={batch.error.message} />;
  const b = batch.data;
  const user = me.data;
  const og = user.gravityUnit === 'plato' ? `${b.derived.ogPlato.toFixed(1)} °P` : b.ogSg.toFixed(3);
  return (
    <>
      <PageHeader
        title={b.name}
        description={
          <>
            Brewed <span className="num">{formatWhen(b.brewedAt, user.timeZone)}</span> ·{' '}
            <span className="num">{formatBatchVolume(b.volumeL, user.unitSystem)}</span> at{' '}
            <span className="num">{og}</span>
          </>
        }
      />
      <div className="space-y-5">
        <Card className="space-y-2">
          <h2 className="text-lg font-semibold">Yeast pitched</h2>
          <ul className="space-y-1">
            {b.pitches.map((p) => (
              <li key={p.cultureId} className="flex flex-wrap items-center gap-x-3">
                <Link className="text-accent underline" to={`/cultures/${p.cultureId}`}>
                  {p.strainName}
                </Link>
                <span className="text-ink-muted">
                  generation <span className="num">{p.generation}</span>
                  {p.cellsPitched != null ? (
                    <>
                      {' '}
                      · <span className="num">{formatCells(p.cellsPitched)}</span> viable cells
                    </>
                  ) : null}
                </span>
                <Link
                  className="inline-flex items-center gap-1 text-accent underline"
                  to={`/batches/generations?cultureId=${p.cultureId}`}
                >
                  <ChartLine aria-hidden className="size-4" />
                  By generation
                </Link>
              </li>
            ))}
          </ul>
          {b.planId ? (
            <Link className="text-sm text-accent underline" to={`/plans/${b.planId}`}>
              The starter plan
            </Link>
          ) : null}
        </Card>
        <Results batch={b} user={user} />
        <Harvest batch={b} />
        {b.harvests.length ? (
          <Card>
            <h2 className="text-lg font-semibold">Harvested from this batch</h2>
            <ul>
              {b.harvests.map((h) => (
                <li key={h.cultureId}>
                  <Link className="text-accent underline" to={`/cultures/${h.cultureId}`}>
                    {h.strainName}
                  </Link>{' '}
                  — generation <span className="num">{h.generation}</span>
                </li>
              ))}
            </ul>
          </Card>
        ) : null}
      </div>
    </>
  );
}
