import { Link, useNavigate, useSearchParams } from 'react-router';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { PasswordResetConfirmSchema, limits } from '@barmkeep/schemas';
import { authQueries } from '../api/auth/queries';
import { usePasswordResetConfirmMutation } from '../api/auth/mutations';
import { Button, Card, FormAlert, Notice, TextField } from '../components';
import { applyApiError } from '../lib/formErrors';
import type { SignInNotice } from './sign-in';

function RequestNewLink() {
  return (
    <Link to="/forgot-password" className="text-accent underline underline-offset-4">
      Ask for a new link
    </Link>
  );
}

export function Component() {
  const [searchParams] = useSearchParams();
  const token = searchParams.get('token') ?? '';
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const confirmReset = usePasswordResetConfirmMutation();

  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm({
    resolver: zodResolver(PasswordResetConfirmSchema),
    // The token is not an input; it rides along from the link.
    defaultValues: { token, password: '' },
  });

  const onSubmit = handleSubmit(async (values) => {
    try {
      await confirmReset.mutateAsync(values);
    } catch (error) {
      applyApiError(error, setError, ['password'], {
        invalid_token: 'This reset link has expired or was already used.',
        rate_limited: 'Too many attempts. Wait a few minutes, then try again.',
      });
      return;
    }
    const user = queryClient.getQueryData(authQueries.me().queryKey);
    if (user) {
      await navigate('/', { replace: true });
    } else {
      const notice: SignInNotice = 'password-reset';
      await navigate('/sign-in', { replace: true, state: { notice } });
    }
  });

  if (!token) {
    return (
      <Card>
        <title>Reset link incomplete · Barmkeep</title>
        <h1 className="mb-4 text-2xl font-semibold tracking-tight">Choose a new password</h1>
        <Notice tone="warning" title="This link is incomplete">
          <p>
            The address is missing its reset code. Open the link from the e-mail again, or copy all of it into the
            address bar.
          </p>
          <p className="mt-2">
            <RequestNewLink />
          </p>
        </Notice>
      </Card>
    );
  }

  const formError = errors.root?.server?.message ?? errors.token?.message;
  const linkIsBad = errors.root?.server?.type === 'invalid_token' || Boolean(errors.token);

  return (
    <Card>
      <title>Choose a new password · Barmkeep</title>
      <h1 className="mb-1 text-2xl font-semibold tracking-tight">Choose a new password</h1>
      <p className="mb-5 text-ink-muted">After this, the old password stops working.</p>
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormAlert message={formError}>
          {linkIsBad ? (
            <p className="mt-1 text-sm">
              <RequestNewLink />
            </p>
          ) : null}
        </FormAlert>
        <TextField
          label="New password"
          type="password"
          hint={`${limits.passwordMin} characters or more.`}
          autoComplete="new-password"
          revealable
          error={errors.password?.message}
          {...register('password')}
        />
        <Button type="submit" className="w-full" busy={isSubmitting} busyLabel="Saving…">
          Save new password
        </Button>
      </form>
      <p className="mt-5 border-t border-rule pt-4 text-sm">
        <Link to="/sign-in" className="text-accent underline underline-offset-4">
          Back to sign in
        </Link>
      </p>
    </Card>
  );
}
