import { Link, useNavigate, useSearchParams } from 'react-router';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { InvitationSignUpSchema, limits, type InvitationPreviewDto, type UserDto } from '@barmkeep/schemas';
import { authQueries } from '../api/auth/queries';
import { useSignOutMutation } from '../api/auth/mutations';
import { isApiError } from '../api/client';
import { invitationQueries } from '../api/invitations/queries';
import { useAcceptInvitationMutation, useInvitationSignUpMutation } from '../api/invitations/mutations';
import { Button, ButtonLink, Card, FormAlert, Loading, Notice, TextField } from '../components';
import { roleLabels } from '../components/clubs/RoleBadge';
import { applyApiError } from '../lib/formErrors';
import { signInPathFor } from './guards';

function Intro({ invitation }: { invitation: InvitationPreviewDto }) {
  return (
    <>
      <h1 className="mb-1 text-2xl font-semibold tracking-tight">Join {invitation.clubName}</h1>
      <p className="mb-3 text-ink-muted">
        {invitation.invitedByName ?? 'A club owner'} invited{' '}
        <span className="font-medium text-ink [overflow-wrap:anywhere]">{invitation.email}</span> to join as{' '}
        {roleLabels[invitation.role].toLowerCase()}.
      </p>
      {invitation.clubDescription ? (
        <p className="mb-4 border-l-2 border-rule-strong pl-3 whitespace-pre-line text-ink-muted">
          {invitation.clubDescription}
        </p>
      ) : null}
    </>
  );
}

function AcceptAs({ token, invitation, user }: { token: string; invitation: InvitationPreviewDto; user: UserDto }) {
  const navigate = useNavigate();
  const accept = useAcceptInvitationMutation();
  const signOut = useSignOutMutation();
  if (user.email.toLowerCase() !== invitation.email) {
    return (
      <Notice tone="warning" title="This invitation is for another address">
        <p>
          You are signed in as <span className="break-all">{user.email}</span>, but the invitation is for{' '}
          <span className="break-all">{invitation.email}</span>. Sign out, then open the link from the e-mail again.
        </p>
        <Button
          variant="secondary"
          className="mt-3"
          busy={signOut.isPending}
          onClick={() => signOut.mutate(undefined, { onSuccess: () => void navigate(0) })}
        >
          Sign out
        </Button>
      </Notice>
    );
  }
  return (
    <div className="space-y-3">
      {accept.isError ? (
        <Notice tone="danger" live="assertive" title="Could not join">
          {accept.error.message}
        </Notice>
      ) : null}
      <Button
        className="w-full"
        busy={accept.isPending}
        busyLabel="Joining…"
        onClick={() =>
          accept.mutate(token, { onSuccess: (club) => void navigate(`/clubs/${club.id}`, { replace: true }) })
        }
      >
        Join {invitation.clubName}
      </Button>
    </div>
  );
}

function SignUpThrough({ token, invitation }: { token: string; invitation: InvitationPreviewDto }) {
  const navigate = useNavigate();
  const signUp = useInvitationSignUpMutation();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm({ resolver: zodResolver(InvitationSignUpSchema), defaultValues: { token, name: '', password: '' } });

  const onSubmit = handleSubmit(async (values) => {
    try {
      const { clubId } = await signUp.mutateAsync(values);
      await navigate(`/clubs/${clubId}`, { replace: true });
    } catch (error) {
      applyApiError(error, setError, ['name', 'password'], {
        rate_limited: 'Too many attempts. Wait a few minutes, then try again.',
      });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <p className="text-sm text-ink-muted">New to Barmkeep? Create your account here; it joins the club at once.</p>
      <FormAlert message={errors.root?.server?.message} />
      <div className="space-y-1.5">
        <p className="text-sm font-medium">E-mail</p>
        <p className="break-all">{invitation.email}</p>
      </div>
      <TextField
        label="Your name"
        hint="Shown to the other members."
        autoComplete="name"
        maxLength={limits.nameMax}
        error={errors.name?.message}
        {...register('name')}
      />
      <TextField
        label="Password"
        type="password"
        hint={`${limits.passwordMin} characters or more.`}
        autoComplete="new-password"
        revealable
        error={errors.password?.message}
        {...register('password')}
      />
      <Button type="submit" className="w-full" busy={isSubmitting} busyLabel="Creating your account…">
        Create account and join
      </Button>
    </form>
  );
}

export function Component() {
  const [searchParams] = useSearchParams();
  const token = searchParams.get('token') ?? '';
  const me = useQuery(authQueries.me());
  const preview = useQuery({ ...invitationQueries.preview(token), enabled: token.length > 0 });
  const here = `/invitation?token=${encodeURIComponent(token)}`;

  if (!token) {
    return (
      <Card>
        <title>Invitation link incomplete · Barmkeep</title>
        <Notice tone="warning" title="This invitation link is incomplete">
          Open the link from the e-mail again; copy the whole address if you pasted it.
        </Notice>
      </Card>
    );
  }
  if (preview.isPending || me.isPending) return <Loading />;
  if (preview.isError) {
    const closed = isApiError(preview.error) && [400, 404, 410].includes(preview.error.status);
    return (
      <Card className="space-y-4">
        <title>Invitation not usable · Barmkeep</title>
        <Notice tone="warning" title={closed ? 'This invitation cannot be used' : 'Could not open the invitation'}>
          {isApiError(preview.error) && preview.error.status === 404
            ? 'The link is not one we know. Check that you opened the whole address from the e-mail.'
            : preview.error.message}
        </Notice>
        <p className="text-sm">
          <Link to="/" className="text-accent underline underline-offset-4">
            Go to Barmkeep
          </Link>
        </p>
      </Card>
    );
  }

  const invitation = preview.data;
  const user = me.data ?? null;
  return (
    <Card>
      <title>{`Join ${invitation.clubName} · Barmkeep`}</title>
      <Intro invitation={invitation} />
      {user ? (
        <AcceptAs token={token} invitation={invitation} user={user} />
      ) : invitation.accountExists ? (
        <div className="space-y-3">
          <p className="text-ink-muted">
            There is already an account for <span className="break-all">{invitation.email}</span>. Sign in with it to
            join.
          </p>
          <ButtonLink to={signInPathFor(here)} className="w-full">
            Sign in to join
          </ButtonLink>
        </div>
      ) : (
        <SignUpThrough token={token} invitation={invitation} />
      )}
    </Card>
  );
}
