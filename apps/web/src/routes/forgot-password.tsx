import { useState } from 'react';
import { Link } from 'react-router';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { PasswordResetRequestSchema } from '@barmkeep/schemas';
import { usePasswordResetRequestMutation } from '../api/auth/mutations';
import { devMailQueries } from '../api/devMail/queries';
import { Button, Card, FormAlert, Notice, TextField } from '../components';
import { applyApiError } from '../lib/formErrors';

/** Points at the local inbox, but only where the API actually has one. */
function LocalInboxHint() {
  const inbox = useQuery(devMailQueries.list());
  if (!inbox.isSuccess) return null;
  return (
    <Notice tone="info" word="Local setup">
      This copy of Barmkeep keeps outgoing mail in a{' '}
      <Link to="/dev/mail" className="text-accent underline underline-offset-4">
        local inbox
      </Link>
      .
    </Notice>
  );
}

export function Component() {
  const requestReset = usePasswordResetRequestMutation();
  const [sentTo, setSentTo] = useState<string | null>(null);

  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm({
    resolver: zodResolver(PasswordResetRequestSchema),
    defaultValues: { email: '' },
  });

  const onSubmit = handleSubmit(async (values) => {
    try {
      await requestReset.mutateAsync(values);
      setSentTo(values.email);
    } catch (error) {
      applyApiError(error, setError, ['email'], {
        rate_limited: 'Too many reset requests. Wait a few minutes, then try again.',
      });
    }
  });

  return (
    <Card>
      <title>Reset your password · Barmkeep</title>
      <h1 className="mb-1 text-2xl font-semibold tracking-tight">Reset your password</h1>
      {sentTo ? (
        <div className="mt-4 space-y-4">
          <Notice tone="success" live="polite" word="Sent">
            If <strong className="break-all">{sentTo}</strong> belongs to an account, a link to choose a new password is
            on its way. It works once and expires after a while, so use it soon. Nothing arrived? Check the spam folder.
          </Notice>
          <LocalInboxHint />
          <Button variant="secondary" onClick={() => setSentTo(null)}>
            Use a different e-mail
          </Button>
        </div>
      ) : (
        <>
          <p className="mb-5 text-ink-muted">Enter the e-mail you signed up with and we will send you a reset link.</p>
          <form onSubmit={onSubmit} noValidate className="space-y-4">
            <FormAlert message={errors.root?.server?.message} />
            <TextField
              label="E-mail"
              type="email"
              autoComplete="email"
              inputMode="email"
              autoCapitalize="none"
              spellCheck={false}
              error={errors.email?.message}
              {...register('email')}
            />
            <Button type="submit" className="w-full" busy={isSubmitting} busyLabel="Sending…">
              Send reset link
            </Button>
          </form>
        </>
      )}
      <p className="mt-5 border-t border-rule pt-4 text-sm">
        <Link to="/sign-in" className="text-accent underline underline-offset-4">
          Back to sign in
        </Link>
      </p>
    </Card>
  );
}
