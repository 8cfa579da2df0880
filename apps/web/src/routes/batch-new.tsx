import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { useQuery } from '@tanstack/react-query';
import { useNavigate, useSearchParams } from 'react-router';
import type { PlanDto, UserDto } from '@barmkeep/schemas';
import { sgFromPlato, usGallonsFromLitres } from '@barmkeep/core';
import { authQueries } from '../api/auth/queries';
import { planningQueries } from '../api/planning/queries';
import { cultureQueries } from '../api/cultures/queries';
import { canBePitched } from '../lib/cultureLabels';
import { useCreateBatchMutation } from '../api/planning/mutations';
import { isApiError } from '../api/client';
import { Button, Card, FormAlert, Loading, Notice, PageHeader, TextField } from '../components';
import {
  formatCells,
  instantFromLocalInput,
  litresFromBatchInput,
  localInputOf,
  sgFromInput,
} from '../lib/planningFormat';

interface Values {
  name: string;
  brewedLocal: string;
  volume: string;
  og: string;
  fg: string;
  tempC: string;
  lagHours: string;
  cellsBillions: string;
  notes: string;
  usedUp: boolean;
}

/** Without a plan, the person ticks the cultures that went in (those still kept and not suspect). */
function CulturePicker({
  chosen,
  onChange,
  error,
}: {
  chosen: string[];
  onChange: (ids: string[]) => void;
  error?: string;
}) {
  const list = useQuery(cultureQueries.list({ pageSize: 100, sort: 'name', dir: 'asc' }));
  if (list.isPending) return <Loading label="Loading your cultures" />;
  if (list.isError)
    return (
      <Notice tone="danger" title="Could not load your cultures">
        {list.error.message}
      </Notice>
    );
  const usable = list.data.cultures.filter(canBePitched);
  if (usable.length === 0) {
    return (
      <Notice tone="warning" title="No culture to pitch">
        Only cultures you still keep (active or stored, not suspect) can go into a batch.
      </Notice>
    );
  }
  return (
    <fieldset className="space-y-2" aria-describedby={error ? 'pitch-error' : undefined}>
      <legend className="font-medium">Which cultures went in</legend>
      {usable.map((c) => (
        <label key={c.id} className="flex min-h-11 items-center gap-3">
          <input
            type="checkbox"
            className="size-5 accent-accent"
            checked={chosen.includes(c.id)}
            onChange={(e) => onChange(e.target.checked ? [...chosen, c.id] : chosen.filter((id) => id !== c.id))}
          />
          <span>
            {c.strainName} <span className="text-sm text-ink-muted">· gen {c.generation}</span>
          </span>
        </label>
      ))}
      {error ? (
        <p id="pitch-error" className="text-sm text-danger">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}

function BatchForm({ user, plan, cultureId }: { user: UserDto; plan: PlanDto | null; cultureId: string | null }) {
  const navigate = useNavigate();
  const [chosen, setChosen] = useState<string[]>(cultureId ? [cultureId] : []);
  const create = useCreateBatchMutation();
  const [error, setError] = useState<string | undefined>();
  const [fields, setFields] = useState<Record<string, string>>({});
  const gravity = (plato: number) => (user.gravityUnit === 'plato' ? plato.toFixed(1) : sgFromPlato(plato).toFixed(3));
  const { register, handleSubmit } = useForm<Values>({
    defaultValues: {
      name: plan?.name ?? '',
      brewedLocal: localInputOf(new Date(), user.timeZone),
      volume: plan?.batchVolumeL
        ? String(
            user.unitSystem === 'us' ? Number(usGallonsFromLitres(plan.batchVolumeL).toFixed(2)) : plan.batchVolumeL,
          )
        : '',
      og: plan?.ogPlato ? gravity(plan.ogPlato) : '',
      fg: '',
      tempC: '',
      lagHours: '',
      cellsBillions: plan ? (plan.computed.final.cells / 1e9).toFixed(0) : '',
      notes: '',
      usedUp: true,
    },
  });
  const planCultures = plan?.cultures.filter((c) => c.available) ?? [];
  const pitchedIds = plan ? planCultures.map((c) => c.id) : chosen;
  const n = (s: string) => (s.trim() === '' ? undefined : Number(s.replace(',', '.')));
  const onSubmit = handleSubmit(async (v) => {
    setError(undefined);
    setFields({});
    const brewedAt = instantFromLocalInput(v.brewedLocal, user.timeZone);
    const cells = n(v.cellsBillions);
    const og = n(v.og);
    const fg = n(v.fg);
    const volume = n(v.volume);
    try {
      const batch = await create.mutateAsync({
        name: v.name,
        brewedAt: brewedAt?.toISOString() ?? '',
        volumeL: volume === undefined ? (undefined as never) : litresFromBatchInput(volume, user.unitSystem),
        ogSg: og === undefined ? (undefined as never) : sgFromInput(og, user.gravityUnit),
        ...(fg !== undefined ? { fgSg: sgFromInput(fg, user.gravityUnit) } : {}),
        ...(n(v.tempC) !== undefined ? { fermentationTempC: n(v.tempC) } : {}),
        ...(n(v.lagHours) !== undefined ? { lagHours: n(v.lagHours) } : {}),
        notes: v.notes,
        ...(plan ? { planId: plan.id } : {}),
        pitches: pitchedIds.map((id, i) => ({
          cultureId: id,
          ...(cells !== undefined && i === 0 ? { cellsPitched: cells * 1e9 } : {}),
        })),
        usedUp: v.usedUp,
      });
      navigate(`/batches/${batch.id}`);
    } catch (err) {
      if (isApiError(err)) {
        const map: Record<string, string> = {
          volumeL: 'volume',
          ogSg: 'og',
          fgSg: 'fg',
          brewedAt: 'brewedLocal',
          fermentationTempC: 'tempC',
        };
        const f: Record<string, string> = {};
        for (const [k, m] of Object.entries(err.fields)) {
          const key = k.replace(/^body\./, '').split('.')[0]!;
          f[map[key] ?? key] = m.join(' ');
        }
        setFields(f);
        setError(err.message);
      } else setError('Something unexpected went wrong. Try again.');
    }
  });
  if (plan && planCultures.length === 0) {
    return (
      <Notice tone="warning" title="This plan has no culture left to pitch">
        Its cultures are used up or no longer yours. Choose “Pitch into a batch” without a plan, from a culture’s page.
      </Notice>
    );
  }
  const g = user.gravityUnit === 'plato' ? '°P' : 'SG';
  return (
    <form onSubmit={onSubmit} noValidate className="max-w-xl space-y-5" aria-label="Record the batch">
      <FormAlert message={error} />
      <Card className="space-y-4">
        {plan ? (
          <p>
            Pitching <strong>{planCultures.map((c) => c.strainName).join(' + ')}</strong>. Each culture gets a “pitched”
            entry in its log.
          </p>
        ) : (
          <>
            <CulturePicker chosen={chosen} onChange={setChosen} error={fields.pitches} />
            <p className="text-sm text-ink-muted">Each culture gets a “pitched” entry in its log.</p>
          </>
        )}
        <TextField label="Batch name" error={fields.name} {...register('name')} />
        <TextField label="Brewed on" type="datetime-local" error={fields.brewedLocal} {...register('brewedLocal')} />
        <TextField
          label={user.unitSystem === 'us' ? 'Volume (US gallons)' : 'Volume (litres)'}
          inputMode="decimal"
          error={fields.volume}
          {...register('volume')}
        />
        <TextField label={`Original gravity (${g})`} inputMode="decimal" error={fields.og} {...register('og')} />
        <TextField
          label="Viable cells pitched (billions)"
          inputMode="decimal"
          hint={plan ? `The plan expects ${formatCells(plan.computed.final.cells)}.` : undefined}
          error={fields.cellsPitched}
          {...register('cellsBillions')}
        />
        <label className="flex min-h-11 items-center gap-3">
          <input type="checkbox" className="size-5 accent-accent" {...register('usedUp')} />
          The whole culture went in (mark it pitched)
        </label>
      </Card>
      <Card className="space-y-4">
        <h2 className="font-semibold">Results (fill in later if you like)</h2>
        <TextField label={`Final gravity (${g})`} inputMode="decimal" error={fields.fg} {...register('fg')} />
        <TextField
          label="Fermentation temperature (°C)"
          inputMode="decimal"
          error={fields.tempC}
          {...register('tempC')}
        />
        <TextField
          label="Lag time: hours to visible activity"
          inputMode="decimal"
          error={fields.lagHours}
          {...register('lagHours')}
        />
        <TextField label="Notes" error={fields.notes} {...register('notes')} />
      </Card>
      <Button type="submit" busy={create.isPending} busyLabel="Saving…">
        Record batch and pitch
      </Button>
    </form>
  );
}

export function Component() {
  const [params] = useSearchParams();
  const planId = params.get('planId');
  const cultureId = params.get('cultureId');
  const me = useQuery(authQueries.me());
  const plan = useQuery({ ...planningQueries.plan(planId ?? ''), enabled: !!planId });
  if (!me.data || (planId && plan.isPending)) return <Loading />;
  return (
    <>
      <PageHeader title="Pitch into a batch" description="Record the brew and the yeast that went in." />
      <BatchForm user={me.data} plan={plan.data ?? null} cultureId={cultureId} />
    </>
  );
}
