import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { Send } from 'lucide-react';
import {
  ClubInvitationCreateSchema,
  clubLimits,
  type ClubInvitationDto,
  type InvitationStatus,
} from '@barmkeep/schemas';
import { clubQueries } from '../api/clubs/queries';
import { useInviteMutation, useRevokeInvitationMutation } from '../api/clubs/mutations';
import { Button, Card, EmptyState, FormAlert, Loading, Notice, Select, TextField } from '../components';
import { roleLabels } from '../components/clubs/RoleBadge';
import { TextArea } from '../components/TextArea';
import { applyApiError } from '../lib/formErrors';
import { formatDateTime } from '../lib/format';
import { canSteward, useClub } from './club';

const statusWords: Record<InvitationStatus, string> = {
  pending: 'Waiting',
  accepted: 'Joined',
  expired: 'Expired',
  revoked: 'Withdrawn',
};

function InviteForm() {
  const club = useClub();
  const invite = useInviteMutation(club.id);
  const roles = club.myRole === 'owner' ? (['member', 'steward', 'owner'] as const) : (['member'] as const);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm({
    resolver: zodResolver(ClubInvitationCreateSchema),
    defaultValues: { email: '', role: 'member' as const, message: '' },
  });

  const [sentTo, setSentTo] = useState<string | null>(null);

  const onSubmit = handleSubmit(async (values) => {
    setSentTo(null);
    try {
      const sent = await invite.mutateAsync(values);
      reset({ email: '', role: values.role, message: '' });
      setSentTo(sent.email);
    } catch (error) {
      applyApiError(error, setError, ['email', 'role', 'message']);
    }
  });

  return (
    <Card>
      <h2 className="mb-1 text-lg font-semibold">Invite someone</h2>
      <p className="mb-4 text-sm text-ink-muted">
        They get an e-mail with a link that works once, for {clubLimits.invitationDays} days. Without an account they
        can create one from the link, with the address you enter here.
      </p>
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormAlert message={errors.root?.server?.message} />
        {sentTo ? <Notice tone="success" live="polite" title={`Invitation sent to ${sentTo}`} /> : null}
        <TextField
          label="Their e-mail"
          type="email"
          inputMode="email"
          autoCapitalize="none"
          spellCheck={false}
          error={errors.email?.message}
          {...register('email')}
        />
        {roles.length > 1 ? (
          <Select
            label="Role in the club"
            options={roles.map((r) => ({ value: r, label: roleLabels[r] }))}
            error={errors.role?.message}
            {...register('role')}
          />
        ) : null}
        <TextArea
          label="A note for them"
          hint="Optional; shown in the e-mail."
          maxLength={500}
          error={errors.message?.message}
          {...register('message')}
        />
        <Button type="submit" icon={<Send aria-hidden className="size-4" />} busy={isSubmitting} busyLabel="Sending…">
          Send invitation
        </Button>
      </form>
    </Card>
  );
}

function InvitationRow({ invitation }: { invitation: ClubInvitationDto }) {
  const club = useClub();
  const revoke = useRevokeInvitationMutation(club.id);
  return (
    <li className="flex flex-wrap items-start justify-between gap-2 border-b border-rule py-3 last:border-0">
      <div className="min-w-0">
        <p className="font-medium break-all">{invitation.email}</p>
        <p className="text-sm text-ink-muted">
          {roleLabels[invitation.role]} · {statusWords[invitation.status]}
          {invitation.status === 'pending' ? ` until ${formatDateTime(invitation.expiresAt)}` : ''}
          {invitation.invitedByName ? ` · invited by ${invitation.invitedByName}` : ''}
        </p>
        {revoke.isError ? <p className="text-sm text-danger">{revoke.error.message}</p> : null}
      </div>
      {invitation.status === 'pending' ? (
        <Button
          variant="secondary"
          className="min-h-10 px-3 text-sm"
          busy={revoke.isPending}
          busyLabel="Withdrawing…"
          onClick={() => revoke.mutate(invitation.id)}
        >
          Withdraw
        </Button>
      ) : null}
    </li>
  );
}

export function Component() {
  const club = useClub();
  const allowed = canSteward(club);
  const invitations = useQuery({ ...clubQueries.invitations(club.id), enabled: allowed });
  if (!allowed) {
    return (
      <Notice tone="info" title="Only stewards and owners send invitations">
        Ask one of them to invite the person.
      </Notice>
    );
  }
  return (
    <div className="grid gap-6 md:grid-cols-[2fr_3fr]">
      <InviteForm />
      <section aria-labelledby="sent-heading">
        <h2 id="sent-heading" className="mb-2 text-lg font-semibold">
          Sent invitations
        </h2>
        {invitations.isPending ? (
          <Loading />
        ) : invitations.isError ? (
          <Notice tone="danger" title="Could not load the invitations">
            {invitations.error.message}
          </Notice>
        ) : invitations.data.length === 0 ? (
          <EmptyState title="No invitations yet">
            <p>Invitations you and the other stewards send show up here with whether they were used.</p>
          </EmptyState>
        ) : (
          <ul className="rounded-lg border border-rule bg-paper-raised px-4">
            {invitations.data.map((inv) => (
              <InvitationRow key={inv.id} invitation={inv} />
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
