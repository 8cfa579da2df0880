import { useMemo, useState } from 'react';
import { Link } from 'react-router';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import {
  createColumnHelper,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { HandHeart, PackagePlus } from 'lucide-react';
import { z } from 'zod';
import {
  CULTURE_FORMS,
  ClubListingCreateSchema,
  StrainRequestCreateSchema,
  type ClubListingDto,
  type CultureForm,
} from '@barmkeep/schemas';
import { authQueries } from '../api/auth/queries';
import { clubQueries } from '../api/clubs/queries';
import { useCreateRequestMutation, useListCultureMutation, useWithdrawListingMutation } from '../api/clubs/mutations';
import { cultureQueries } from '../api/cultures/queries';
import { Button, Card, EmptyState, FormAlert, Loading, Notice, Select, TextField } from '../components';
import { Availability } from '../components/clubs/Availability';
import { ColdCaution, isFrozenForm } from '../components/clubs/ColdCaution';
import { DataTable } from '../components/clubs/DataTable';
import { TextArea } from '../components/TextArea';
import { applyApiError } from '../lib/formErrors';
import { formLabels } from '../lib/cultureLabels';
import { canSteward, useClub } from './club';

const column = createColumnHelper<ClubListingDto>();
const pct = (v: number | null) => (v === null ? '—' : `${Math.round(v * 100)} %`);
const unitWords = {
  vial: ['vial', 'vials'],
  slant: ['slant', 'slants'],
  plate: ['plate', 'plates'],
  pack: ['pack', 'packs'],
};
export const unitsText = (unit: keyof typeof unitWords, n: number) => `${n} ${unitWords[unit][n === 1 ? 0 : 1]}`;

/** The form a person fills in; `neededBy` is a date here and an instant on the wire. */
const RequestFormSchema = z.object({
  message: StrainRequestCreateSchema.shape.message,
  neededBy: z.string().regex(/^(\d{4}-\d\d-\d\d)?$/, 'Pick a date'),
  wantedForm: z.union([z.enum(CULTURE_FORMS), z.literal('')]),
});

function RequestForm({ listing, onDone }: { listing: ClubListingDto; onDone: (sent: boolean) => void }) {
  const club = useClub();
  const create = useCreateRequestMutation(club.id);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm({
    resolver: zodResolver(RequestFormSchema),
    defaultValues: { message: '', neededBy: '', wantedForm: '' as CultureForm | '' },
  });
  const onSubmit = handleSubmit(async (v) => {
    try {
      await create.mutateAsync({
        listingId: listing.id,
        message: v.message,
        ...(v.neededBy ? { neededBy: new Date(`${v.neededBy}T12:00:00`).toISOString() } : {}),
        ...(v.wantedForm ? { wantedForm: v.wantedForm } : {}),
      });
      onDone(true);
    } catch (error) {
      applyApiError(error, setError, ['message', 'neededBy', 'wantedForm']);
    }
  });
  return (
    <Card className="space-y-4" aria-labelledby="ask-heading">
      <h3 id="ask-heading" className="text-lg font-semibold">
        Ask for {listing.strainName}
      </h3>
      <p className="text-sm text-ink-muted">
        {listing.stock
          ? 'Club stock: a steward answers and hands a unit over.'
          : `${listing.keeper.name} keeps it and answers.`}{' '}
        {club.requestsNeedApproval ? 'A steward approves requests first in this club.' : ''}
      </p>
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormAlert message={errors.root?.server?.message} />
        <TextArea
          label="Message"
          hint="What you will brew with it, and how you could collect it."
          maxLength={1000}
          error={errors.message?.message}
          {...register('message')}
        />
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField label="Needed by" type="date" error={errors.neededBy?.message} {...register('neededBy')} />
          <Select
            label="In what form"
            options={[
              { value: '', label: 'Whatever suits the keeper' },
              ...CULTURE_FORMS.map((f) => ({ value: f, label: formLabels[f] })),
            ]}
            error={errors.wantedForm?.message}
            {...register('wantedForm')}
          />
        </div>
        {isFrozenForm(listing.form) ? <ColdCaution /> : null}
        <div className="flex flex-wrap gap-2">
          <Button
            type="submit"
            busy={isSubmitting}
            busyLabel="Sending…"
            icon={<HandHeart aria-hidden className="size-4" />}
          >
            Send the request
          </Button>
          <Button type="button" variant="secondary" onClick={() => onDone(false)}>
            Cancel
          </Button>
        </div>
      </form>
    </Card>
  );
}

/** List one of my cultures in this club's bank. Also used on the culture page. */
export function OfferForm({
  clubId,
  cultureId,
  onListed,
}: {
  clubId: string;
  cultureId?: string;
  onListed?: () => void;
}) {
  const list = useListCultureMutation(clubId);
  const mine = useQuery({ ...cultureQueries.list({ pageSize: 100, sort: 'name', dir: 'asc' }), enabled: !cultureId });
  const offerable = (mine.data?.cultures ?? []).filter(
    (c) => !c.suspect && !['discarded', 'used_up', 'quarantined', 'pitched'].includes(c.state),
  );
  const [done, setDone] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm({
    resolver: zodResolver(ClubListingCreateSchema),
    defaultValues: { cultureId: cultureId ?? '', note: '' },
  });
  const onSubmit = handleSubmit(async (v) => {
    setDone(null);
    try {
      await list.mutateAsync(v);
      reset({ cultureId: cultureId ?? '', note: '' });
      setDone('Listed. The other members can now ask for it.');
      onListed?.();
    } catch (error) {
      applyApiError(error, setError, ['cultureId', 'note']);
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <FormAlert message={errors.root?.server?.message} />
      {done ? <Notice tone="success" live="polite" title={done} /> : null}
      {cultureId ? (
        <input type="hidden" {...register('cultureId')} />
      ) : (
        <Select
          label="Which culture"
          hint="Only the bank summary is shown: strain, form, generation and today’s projected viability. Your notes, log and photos stay yours."
          options={[
            {
              value: '',
              label: offerable.length ? 'Choose one of your cultures' : 'No culture of yours can be offered',
            },
            ...offerable.map((c) => ({
              value: c.id,
              label: `${c.strainName} · ${formLabels[c.form]} · gen ${c.generation}`,
            })),
          ]}
          error={errors.cultureId?.message ? 'Choose one of your cultures' : undefined}
          {...register('cultureId')}
        />
      )}
      <TextField
        label="A note for the members"
        hint="Optional, e.g. when you can hand it over."
        maxLength={500}
        error={errors.note?.message}
        {...register('note')}
      />
      <Button
        type="submit"
        variant="secondary"
        busy={isSubmitting}
        icon={<PackagePlus aria-hidden className="size-4" />}
      >
        List it in the bank
      </Button>
    </form>
  );
}

export function Component() {
  const club = useClub();
  const { data: me } = useQuery(authQueries.me());
  const bank = useQuery(clubQueries.bank(club.id));
  const withdraw = useWithdrawListingMutation(club.id);
  const [asking, setAsking] = useState<ClubListingDto | null>(null);
  const [sent, setSent] = useState<string | null>(null);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'strainName', desc: false }]);
  const steward = canSteward(club);

  const columns = useMemo(
    () => [
      column.accessor('strainName', {
        header: 'Strain',
        cell: (info) => (
          <span className="block min-w-36">
            <span className="font-medium">{info.getValue()}</span>
            {info.row.original.species ? (
              <i className="block text-sm text-ink-muted">{info.row.original.species}</i>
            ) : null}
            {info.row.original.note ? (
              <span className="block text-sm text-ink-muted">{info.row.original.note}</span>
            ) : null}
          </span>
        ),
      }),
      column.accessor((l) => l.keeper.name, {
        id: 'keeper',
        header: 'Keeper',
        cell: (info) => {
          const l = info.row.original;
          return l.stock ? (
            <span className="block min-w-28">
              Club stock
              <span className="block text-sm text-ink-muted">
                <span className="num">{unitsText(l.stock.unit, l.stock.unitsLeft)}</span> left, held by {l.keeper.name}
              </span>
            </span>
          ) : (
            <span>
              {l.keeper.name}
              {l.keeper.id === me?.id ? <span className="ml-1 text-sm text-ink-muted">(you)</span> : null}
            </span>
          );
        },
      }),
      column.accessor('form', {
        header: 'Form',
        cell: (info) => formLabels[info.getValue() as CultureForm] ?? info.getValue(),
      }),
      column.accessor('generation', {
        header: 'Gen.',
        cell: (info) => <span className="num">{info.getValue()}</span>,
      }),
      column.accessor('projectedViability', {
        header: 'Viability today',
        sortUndefined: 'last',
        cell: (info) => (
          <span className="num" title="Projected from the keeper’s records">
            {pct(info.getValue())}
          </span>
        ),
      }),
      column.accessor('canRequest', {
        header: 'Can be requested',
        cell: (info) => <Availability listing={info.row.original} myId={me?.id} />,
      }),
      column.display({
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        cell: (info) => {
          const l = info.row.original;
          return (
            <span className="inline-flex flex-wrap gap-1">
              {l.canRequest ? (
                <Button
                  variant="secondary"
                  className="min-h-10 px-3 text-sm"
                  aria-label={`Ask for ${l.strainName}`}
                  onClick={() => {
                    setSent(null);
                    setAsking(l);
                  }}
                >
                  Ask for it
                </Button>
              ) : l.myRequest ? (
                <Link to="../requests" className="inline-flex min-h-10 items-center px-2 text-sm text-accent underline">
                  See your request
                </Link>
              ) : null}
              {l.keeper.id === me?.id || steward ? (
                <Button
                  variant="quiet"
                  className="min-h-10 px-2 text-sm"
                  aria-label={`Take ${l.strainName} out of the bank`}
                  busy={withdraw.isPending && withdraw.variables === l.id}
                  onClick={() => withdraw.mutate(l.id)}
                >
                  Take out
                </Button>
              ) : null}
            </span>
          );
        },
      }),
    ],
    [me?.id, steward, withdraw],
  );

  const table = useReactTable({
    data: bank.data ?? [],
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getRowId: (row) => row.id,
  });

  return (
    <div className="space-y-6">
      <section aria-labelledby="bank-heading" className="space-y-3">
        <h2 id="bank-heading" className="text-lg font-semibold">
          The club’s bank {bank.data ? <span className="num text-ink-muted">({bank.data.length})</span> : null}
        </h2>
        <p className="text-sm text-ink-muted">
          Strains the members and the club keep and will pass on. Viability is today’s projection from each keeper’s own
          records; count before you pitch.
        </p>
        {sent ? <Notice tone="success" live="polite" title={sent} /> : null}
        {withdraw.isError ? (
          <Notice tone="danger" live="assertive" title="Still listed">
            {withdraw.error.message}
          </Notice>
        ) : null}
        {bank.isPending ? (
          <Loading />
        ) : bank.isError ? (
          <Notice tone="danger" title="Could not load the bank">
            {bank.error.message}
          </Notice>
        ) : bank.data.length === 0 ? (
          <EmptyState title="Nothing in the bank yet">
            <p>List one of your cultures below, and the other members can ask you for some.</p>
          </EmptyState>
        ) : (
          <DataTable table={table} caption="Strains in the club’s bank" />
        )}
      </section>
      {asking ? (
        <RequestForm
          key={asking.id}
          listing={asking}
          onDone={(ok) => {
            if (ok) setSent(`Request for ${asking.strainName} sent. Follow it under Requests.`);
            setAsking(null);
          }}
        />
      ) : null}
      {club.myRole ? (
        <Card className="space-y-3">
          <h2 className="text-lg font-semibold">Offer one of your cultures</h2>
          <OfferForm clubId={club.id} />
          <p className="text-sm text-ink-muted">
            Or open a culture in{' '}
            <Link to="/cultures" className="text-accent underline">
              your library
            </Link>{' '}
            and list it from there.
          </p>
        </Card>
      ) : null}
      {bank.data?.some((l) => l.stock && isFrozenForm(l.form)) ? (
        <p className="text-sm text-ink-muted">
          Frozen club stock is handed over by a steward; see{' '}
          <Link to="../stock" className="text-accent underline">
            Stock
          </Link>{' '}
          for the count and the care it needs.
        </p>
      ) : null}
    </div>
  );
}
