import { useState } from 'react';
import { Link } from 'react-router';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { Check, CircleCheck, CircleX, Clock, Hourglass, PackageCheck, X, type LucideIcon } from 'lucide-react';
import {
  LIVE_REQUEST_STATUSES,
  StrainRequestReceiveSchema,
  StrainRequestRespondSchema,
  type StrainRequestDto,
} from '@barmkeep/schemas';
import { authQueries } from '../api/auth/queries';
import { clubQueries } from '../api/clubs/queries';
import { useCancelRequestMutation, useReceiveMutation, useRespondMutation } from '../api/clubs/mutations';
import { Button, Card, EmptyState, FormAlert, Loading, Notice, TextField } from '../components';
import { ColdCaution, isFrozenForm } from '../components/clubs/ColdCaution';
import { TextArea } from '../components/TextArea';
import { applyApiError } from '../lib/formErrors';
import { formatDateTime } from '../lib/format';
import { formLabels } from '../lib/cultureLabels';
import { canSteward, useClub } from './club';

type Status = StrainRequestDto['status'];
const statusWords: Record<Status, { word: string; Icon: LucideIcon }> = {
  awaiting_approval: { word: 'Waiting for a steward', Icon: Hourglass },
  open: { word: 'Waiting for an answer', Icon: Clock },
  proposed: { word: 'Another time proposed', Icon: Clock },
  accepted: { word: 'Accepted: waiting for the handover', Icon: CircleCheck },
  declined: { word: 'Declined', Icon: CircleX },
  received: { word: 'Handed over', Icon: PackageCheck },
  cancelled: { word: 'Taken back', Icon: X },
};

function StatusWord({ status }: { status: Status }) {
  const { word, Icon } = statusWords[status];
  return (
    <span className="inline-flex items-center gap-1 text-sm font-medium">
      <Icon aria-hidden className="size-4" />
      {word}
    </span>
  );
}

function Facts({ r }: { r: StrainRequestDto }) {
  return (
    <div className="space-y-1 text-sm">
      <p className="text-ink-muted">
        {r.requester.name} asked {r.clubStock ? 'the club’s stock' : r.keeper.name} on {formatDateTime(r.createdAt)}
        {r.neededBy ? ` · needed by ${formatDateTime(r.neededBy)}` : ''}
        {r.wantedForm ? ` · as ${formLabels[r.wantedForm].toLowerCase()}` : ''}
      </p>
      {r.message ? <p className="whitespace-pre-line">“{r.message}”</p> : null}
      {r.responseNote || r.proposedAt ? (
        <p className="whitespace-pre-line">
          <span className="text-ink-muted">Answer: </span>
          {r.proposedAt ? `how about ${formatDateTime(r.proposedAt)}? ` : ''}
          {r.responseNote}
        </p>
      ) : null}
    </div>
  );
}

/** `proposedAt` is a local date-time field here and an instant on the wire. */
const AnswerFormSchema = z.object({
  note: StrainRequestRespondSchema.shape.note,
  proposedAt: z.string(),
});

function Answer({ r }: { r: StrainRequestDto }) {
  const club = useClub();
  const respond = useRespondMutation(club.id);
  const [proposing, setProposing] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm({ resolver: zodResolver(AnswerFormSchema), defaultValues: { note: '', proposedAt: '' } });
  const send = (action: 'accept' | 'decline' | 'propose') =>
    handleSubmit(async (v) => {
      if (action === 'propose' && !v.proposedAt) {
        setError('proposedAt', { message: 'Say when instead' });
        return;
      }
      try {
        await respond.mutateAsync({
          requestId: r.id,
          action,
          note: v.note,
          ...(action === 'propose' ? { proposedAt: new Date(v.proposedAt).toISOString() } : {}),
        });
      } catch (error) {
        applyApiError(error, setError, ['note', 'proposedAt']);
      }
    });
  return (
    <form noValidate className="mt-3 space-y-3" onSubmit={(e) => e.preventDefault()}>
      <FormAlert message={errors.root?.server?.message} />
      <TextArea
        label={`A note for ${r.requester.name}`}
        hint="Optional: where and when to collect it."
        rows={2}
        maxLength={1000}
        error={errors.note?.message}
        {...register('note')}
      />
      {proposing ? (
        <TextField
          label="Another time"
          type="datetime-local"
          error={errors.proposedAt?.message}
          {...register('proposedAt')}
        />
      ) : null}
      <div className="flex flex-wrap gap-2">
        {proposing ? (
          <>
            <Button busy={isSubmitting} onClick={send('propose')}>
              Propose this time
            </Button>
            <Button variant="secondary" onClick={() => setProposing(false)}>
              Back
            </Button>
          </>
        ) : (
          <>
            <Button busy={isSubmitting} icon={<Check aria-hidden className="size-4" />} onClick={send('accept')}>
              Accept
            </Button>
            <Button variant="secondary" onClick={() => setProposing(true)}>
              Propose another time…
            </Button>
            <Button variant="danger" busy={isSubmitting} onClick={send('decline')}>
              Decline
            </Button>
          </>
        )}
      </div>
    </form>
  );
}

function Approve({ r }: { r: StrainRequestDto }) {
  const club = useClub();
  const respond = useRespondMutation(club.id);
  return (
    <div className="mt-3 space-y-2">
      {respond.isError ? <FormAlert message={respond.error.message} /> : null}
      <Button busy={respond.isPending} onClick={() => respond.mutate({ requestId: r.id, action: 'approve', note: '' })}>
        Approve: pass it to {r.clubStock ? 'the stewards' : r.keeper.name}
      </Button>
    </div>
  );
}

function Receive({ r, form }: { r: StrainRequestDto; form: string | null }) {
  const club = useClub();
  const receive = useReceiveMutation(club.id);
  const frozen = isFrozenForm(form);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm({
    resolver: zodResolver(StrainRequestReceiveSchema),
    defaultValues: { locationLabel: '', storageTempC: frozen ? -18 : 4 },
  });
  const onSubmit = handleSubmit(async (v) => {
    try {
      // the request turns to "handed over" and shows the link to the new culture
      await receive.mutateAsync({ requestId: r.id, ...v });
    } catch (error) {
      applyApiError(error, setError, ['locationLabel', 'storageTempC']);
    }
  });
  return (
    <form noValidate onSubmit={onSubmit} className="mt-3 space-y-3">
      <FormAlert message={errors.root?.server?.message} />
      <p className="text-sm">Once you have it in hand, confirm it: it becomes a culture in your library.</p>
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField
          label="Where you keep it"
          maxLength={120}
          error={errors.locationLabel?.message}
          {...register('locationLabel')}
        />
        <TextField
          label="Storage temperature (°C)"
          type="number"
          inputMode="decimal"
          step="0.5"
          error={errors.storageTempC?.message}
          {...register('storageTempC')}
        />
      </div>
      {frozen ? <ColdCaution /> : null}
      <Button type="submit" busy={isSubmitting} icon={<PackageCheck aria-hidden className="size-4" />}>
        I received it
      </Button>
    </form>
  );
}

/** Take one's own request back while it is under way (asks once more first). */
function TakeBack({ r }: { r: StrainRequestDto }) {
  const club = useClub();
  const cancel = useCancelRequestMutation(club.id);
  const [asking, setAsking] = useState(false);
  if (!(LIVE_REQUEST_STATUSES as readonly string[]).includes(r.status)) return null;
  return (
    <div className="mt-3 flex flex-wrap items-center gap-2">
      {asking ? (
        <>
          <span className="text-sm">Take this request back? {r.keeper.name} is told.</span>
          <Button
            variant="danger"
            className="min-h-10 px-3 text-sm"
            busy={cancel.isPending}
            onClick={() => cancel.mutate(r.id)}
          >
            Yes, take it back
          </Button>
          <Button variant="secondary" className="min-h-10 px-3 text-sm" onClick={() => setAsking(false)}>
            Keep it
          </Button>
        </>
      ) : (
        <Button variant="quiet" className="min-h-10 px-2 text-sm" onClick={() => setAsking(true)}>
          Take back my request
        </Button>
      )}
      {cancel.error ? <p className="w-full text-sm text-danger">{cancel.error.message}</p> : null}
    </div>
  );
}

function RequestItem({ r, children }: { r: StrainRequestDto; children?: React.ReactNode }) {
  return (
    <li
      className="border-b border-rule py-4 last:border-0"
      aria-label={`Request for ${r.strainName} by ${r.requester.name}`}
    >
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h4 className="font-semibold">{r.strainName}</h4>
        <StatusWord status={r.status} />
      </div>
      <Facts r={r} />
      {children}
    </li>
  );
}

function Group({
  title,
  items,
  empty,
  render,
}: {
  title: string;
  items: StrainRequestDto[];
  empty?: string;
  render: (r: StrainRequestDto) => React.ReactNode;
}) {
  if (!items.length && !empty) return null;
  return (
    <section className="space-y-2">
      <h3 className="text-lg font-semibold">
        {title} <span className="num text-ink-muted">({items.length})</span>
      </h3>
      {items.length ? (
        <ul className="rounded-lg border border-rule bg-paper-raised px-4">{items.map(render)}</ul>
      ) : (
        <p className="text-sm text-ink-muted">{empty}</p>
      )}
    </section>
  );
}

export function Component() {
  const club = useClub();
  const { data: me } = useQuery(authQueries.me());
  const requests = useQuery(clubQueries.requests(club.id));
  const bank = useQuery(clubQueries.bank(club.id));
  const steward = canSteward(club);
  if (requests.isPending) return <Loading />;
  if (requests.isError)
    return (
      <Notice tone="danger" title="Could not load the requests">
        {requests.error.message}
      </Notice>
    );
  const all = requests.data;
  const formOf = (r: StrainRequestDto) => bank.data?.find((l) => l.id === r.listingId)?.form ?? r.wantedForm;
  const live = (r: StrainRequestDto) => ['open', 'proposed'].includes(r.status);
  const toAnswer = all.filter((r) => live(r) && (r.keeper.id === me?.id || (r.clubStock && steward)));
  const toApprove = steward ? all.filter((r) => r.status === 'awaiting_approval') : [];
  const mine = all.filter((r) => r.requester.id === me?.id);
  const shown = new Set([...toAnswer, ...toApprove, ...mine].map((r) => r.id));
  const rest = all.filter((r) => !shown.has(r.id));

  if (!all.length) {
    return (
      <EmptyState title="No requests yet">
        <p>
          Ask for a strain from the{' '}
          <Link to="../bank" className="text-accent underline">
            bank
          </Link>
          ; requests to you and from you show up here.
        </p>
      </EmptyState>
    );
  }
  return (
    <Card className="space-y-6">
      <h2 className="sr-only">Requests</h2>
      <Group
        title="Waiting for your answer"
        items={toAnswer}
        empty="Nobody is waiting for you."
        render={(r) => (
          <RequestItem key={r.id} r={r}>
            <Answer r={r} />
          </RequestItem>
        )}
      />
      <Group
        title="Waiting for a steward’s approval"
        items={toApprove}
        render={(r) => (
          <RequestItem key={r.id} r={r}>
            <Approve r={r} />
          </RequestItem>
        )}
      />
      <Group
        title="Your requests"
        items={mine}
        empty="You have not asked for anything in this club."
        render={(r) => (
          <RequestItem key={r.id} r={r}>
            {r.status === 'accepted' ? <Receive r={r} form={formOf(r)} /> : null}
            <TakeBack r={r} />
            {r.receivedCultureId ? (
              <Notice tone="success" title="It is in your library now" className="mt-3">
                <Link to={`/cultures/${r.receivedCultureId}`} className="text-accent underline">
                  Open your new culture
                </Link>{' '}
                — its lineage runs back through {r.clubStock ? 'the club’s stock' : r.keeper.name}.
              </Notice>
            ) : null}
          </RequestItem>
        )}
      />
      <Group title="Other requests in the club" items={rest} render={(r) => <RequestItem key={r.id} r={r} />} />
    </Card>
  );
}
