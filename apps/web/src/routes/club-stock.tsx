import { useState } from 'react';
import { Link } from 'react-router';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { Snowflake } from 'lucide-react';
import {
  CLUB_STOCK_UNITS,
  ClubStockCreateSchema,
  ClubStockUpdateSchema,
  ClubStockWithdrawSchema,
  type ClubStockDto,
  type ClubStockUnit,
} from '@barmkeep/schemas';
import { authQueries } from '../api/auth/queries';
import { clubQueries } from '../api/clubs/queries';
import { useAddStockMutation, useUpdateStockMutation, useWithdrawStockMutation } from '../api/clubs/mutations';
import { cultureQueries } from '../api/cultures/queries';
import { Button, Card, EmptyState, FormAlert, Loading, Notice, Select, TextField } from '../components';
import { ColdCaution, isFrozenForm } from '../components/clubs/ColdCaution';
import { applyApiError } from '../lib/formErrors';
import { formLabels } from '../lib/cultureLabels';
import { unitsText } from './club-bank';
import { canSteward, useClub } from './club';

const unitLabels: Record<ClubStockUnit, string> = { vial: 'Vials', slant: 'Slants', plate: 'Plates', pack: 'Packs' };
const pct = (v: number | null) => (v === null ? '—' : `${Math.round(v * 100)} %`);

function WithdrawOne({ s, onDone }: { s: ClubStockDto; onDone: (cultureId: string, mine: boolean) => void }) {
  const club = useClub();
  const { data: me } = useQuery(authQueries.me());
  const members = useQuery(clubQueries.members(club.id));
  const withdraw = useWithdrawStockMutation(club.id);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm({
    resolver: zodResolver(ClubStockWithdrawSchema),
    defaultValues: {
      recipientUserId: me?.id ?? '',
      locationLabel: '',
      storageTempC: isFrozenForm(s.form) ? -18 : 4,
      note: '',
    },
  });
  const onSubmit = handleSubmit(async (v) => {
    try {
      const res = await withdraw.mutateAsync({ cultureId: s.cultureId, ...v });
      onDone(res.cultureId, !v.recipientUserId || v.recipientUserId === me?.id);
    } catch (error) {
      applyApiError(error, setError, ['recipientUserId', 'locationLabel', 'storageTempC', 'note']);
    }
  });
  return (
    <form noValidate onSubmit={onSubmit} className="mt-3 space-y-3 rounded-md border border-rule p-3">
      <FormAlert message={errors.root?.server?.message} />
      <Select
        label="For whom"
        options={(members.data ?? []).map((m) => ({
          value: m.userId,
          label: m.userId === me?.id ? `${m.name} (you)` : m.name,
        }))}
        error={errors.recipientUserId?.message}
        {...register('recipientUserId')}
      />
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField
          label="Where they will keep it"
          maxLength={120}
          error={errors.locationLabel?.message}
          {...register('locationLabel')}
        />
        <TextField
          label="Their storage temperature (°C)"
          type="number"
          inputMode="decimal"
          step="0.5"
          error={errors.storageTempC?.message}
          {...register('storageTempC')}
        />
      </div>
      <Button type="submit" busy={isSubmitting} busyLabel="Taking one out…">
        Withdraw one {s.unit}
      </Button>
    </form>
  );
}

function StockTake({ s }: { s: ClubStockDto }) {
  const club = useClub();
  const update = useUpdateStockMutation(club.id);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm({ resolver: zodResolver(ClubStockUpdateSchema), defaultValues: { unitsLeft: s.unitsLeft } });
  const onSubmit = handleSubmit(async (v) => {
    try {
      await update.mutateAsync({ cultureId: s.cultureId, ...v });
    } catch (error) {
      applyApiError(error, setError, ['unitsLeft']);
    }
  });
  return (
    <form noValidate onSubmit={onSubmit} className="mt-3 grid gap-3 sm:grid-cols-[1fr_auto] sm:items-end">
      <TextField
        label="Counted in the freezer or fridge"
        type="number"
        inputMode="numeric"
        min={0}
        error={errors.unitsLeft?.message ?? errors.root?.server?.message}
        {...register('unitsLeft')}
      />
      <Button type="submit" variant="secondary" busy={isSubmitting}>
        Correct the count
      </Button>
    </form>
  );
}

function StockItem({ s }: { s: ClubStockDto }) {
  const club = useClub();
  const steward = canSteward(club);
  const [open, setOpen] = useState<'withdraw' | 'count' | null>(null);
  const [made, setMade] = useState<{ id: string; mine: boolean } | null>(null);
  const usable = !s.suspect && s.state !== 'quarantined' && s.unitsLeft > 0;
  return (
    <li className="border-b border-rule py-4 last:border-0" aria-label={`${s.strainName}, club stock`}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="font-semibold">{s.strainName}</h3>
        <span className="num font-medium">{unitsText(s.unit, s.unitsLeft)} left</span>
      </div>
      <p className="text-sm text-ink-muted">
        {formLabels[s.form]} · generation <span className="num">{s.generation}</span> · held by {s.keeper.name} at{' '}
        <span className="num">{s.storageTempC} °C</span> · viability today{' '}
        <span className="num">{pct(s.projectedViability)}</span>
        {s.suspect ? <span className="font-medium text-danger"> · suspect: do not hand out</span> : null}
      </p>
      {made ? (
        <Notice tone="success" live="polite" title="One taken out" className="mt-2">
          {made.mine ? (
            <Link to={`/cultures/${made.id}`} className="text-accent underline">
              Open your new culture
            </Link>
          ) : (
            'The member has it in their library now, with its lineage back to this stock.'
          )}
        </Notice>
      ) : null}
      {steward ? (
        <div className="mt-2 flex flex-wrap gap-2">
          {usable ? (
            <Button
              variant="secondary"
              className="min-h-10 text-sm"
              onClick={() => setOpen(open === 'withdraw' ? null : 'withdraw')}
            >
              Withdraw one…
            </Button>
          ) : null}
          <Button
            variant="quiet"
            className="min-h-10 text-sm"
            onClick={() => setOpen(open === 'count' ? null : 'count')}
          >
            Stock-take…
          </Button>
        </div>
      ) : null}
      {open === 'withdraw' ? (
        <WithdrawOne
          s={s}
          onDone={(id, mine) => {
            setMade({ id, mine });
            setOpen(null);
          }}
        />
      ) : null}
      {open === 'count' ? <StockTake s={s} /> : null}
    </li>
  );
}

function AddStock() {
  const club = useClub();
  const add = useAddStockMutation(club.id);
  const mine = useQuery(cultureQueries.list({ pageSize: 100, sort: 'name', dir: 'asc' }));
  const [done, setDone] = useState<string | null>(null);
  const usable = (mine.data?.cultures ?? []).filter(
    (c) => !c.suspect && !['discarded', 'used_up', 'quarantined', 'pitched'].includes(c.state),
  );
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm({
    resolver: zodResolver(ClubStockCreateSchema),
    defaultValues: { cultureId: '', unit: 'vial' as ClubStockUnit, units: 6, note: '' },
  });
  const onSubmit = handleSubmit(async (v) => {
    setDone(null);
    try {
      const s = await add.mutateAsync(v);
      reset();
      setDone(`${s.strainName} is club stock now, and listed in the bank.`);
    } catch (error) {
      applyApiError(error, setError, ['cultureId', 'unit', 'units', 'note']);
    }
  });
  return (
    <Card className="space-y-4">
      <h2 className="text-lg font-semibold">Add club stock</h2>
      <p className="text-sm text-ink-muted">
        A culture you keep for the club, in identical units: a box of frozen vials, a rack of slants. The club becomes
        its owner and you stay the one who holds it; members ask for a unit in the bank.
      </p>
      <form noValidate onSubmit={onSubmit} className="space-y-4">
        <FormAlert message={errors.root?.server?.message} />
        {done ? <Notice tone="success" live="polite" title={done} /> : null}
        <Select
          label="Which of your cultures"
          options={[
            { value: '', label: 'Choose a culture you keep' },
            ...usable.map((c) => ({
              value: c.id,
              label: `${c.strainName} · ${formLabels[c.form]} · gen ${c.generation}`,
            })),
          ]}
          error={errors.cultureId?.message ? 'Choose a culture you keep' : undefined}
          {...register('cultureId')}
        />
        <div className="grid gap-4 sm:grid-cols-2">
          <Select
            label="Kept as"
            options={CLUB_STOCK_UNITS.map((u) => ({ value: u, label: unitLabels[u] }))}
            error={errors.unit?.message}
            {...register('unit')}
          />
          <TextField
            label="How many"
            type="number"
            inputMode="numeric"
            min={1}
            error={errors.units?.message}
            {...register('units')}
          />
        </div>
        <TextField label="A note for the members" maxLength={500} error={errors.note?.message} {...register('note')} />
        <Button type="submit" busy={isSubmitting} icon={<Snowflake aria-hidden className="size-4" />}>
          Add to the club’s stock
        </Button>
      </form>
    </Card>
  );
}

export function Component() {
  const club = useClub();
  const stock = useQuery(clubQueries.stock(club.id));
  const steward = canSteward(club);
  const frozen = stock.data?.some((s) => isFrozenForm(s.form)) ?? false;
  return (
    <div className="space-y-6">
      <section aria-labelledby="stock-heading" className="space-y-3">
        <h2 id="stock-heading" className="text-lg font-semibold">
          The club’s own stock
        </h2>
        <p className="text-sm text-ink-muted">
          Kept by the stewards for everyone: the frozen library and slants. Members ask for a unit in the{' '}
          <Link to="../bank" className="text-accent underline">
            bank
          </Link>
          ; a steward hands it over.
        </p>
        {frozen || steward ? <ColdCaution /> : null}
        {stock.isPending ? (
          <Loading />
        ) : stock.isError ? (
          <Notice tone="danger" title="Could not load the stock">
            {stock.error.message}
          </Notice>
        ) : stock.data.length === 0 ? (
          <EmptyState title="No club stock yet">
            <p>{steward ? 'Add a culture you keep for the club below.' : 'The stewards have not added any yet.'}</p>
          </EmptyState>
        ) : (
          <ul className="rounded-lg border border-rule bg-paper-raised px-4">
            {stock.data.map((s) => (
              <StockItem key={s.cultureId} s={s} />
            ))}
          </ul>
        )}
      </section>
      {steward ? <AddStock /> : null}
    </div>
  );
}
