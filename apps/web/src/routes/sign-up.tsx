import { Link, useNavigate, useSearchParams } from 'react-router';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { AuthSignUpSchema, limits } from '@barmkeep/schemas';
import { authQueries } from '../api/auth/queries';
import { useSignUpMutation } from '../api/auth/mutations';
import { Button, Card, FormAlert, TextField } from '../components';
import { applyApiError, safeNextPath } from '../lib/formErrors';
import type { SignInNotice } from './sign-in';

export function Component() {
  const [searchParams] = useSearchParams();
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const signUp = useSignUpMutation();
  const next = safeNextPath(searchParams.get('next'));

  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm({
    resolver: zodResolver(AuthSignUpSchema),
    defaultValues: { name: '', email: '', password: '' },
  });

  const onSubmit = handleSubmit(async (values) => {
    try {
      await signUp.mutateAsync(values);
    } catch (error) {
      applyApiError(error, setError, ['name', 'email', 'password'], {
        email_taken: 'An account with this e-mail already exists. Sign in instead, or reset its password.',
        rate_limited: 'Too many attempts. Wait a few minutes, then try again.',
      });
      return;
    }
    // The mutation refreshed who is signed in; sign-up normally starts a session.
    const user = queryClient.getQueryData(authQueries.me().queryKey);
    if (user) {
      await navigate(next ?? '/', { replace: true });
    } else {
      const notice: SignInNotice = 'account-created';
      await navigate('/sign-in', { replace: true, state: { notice } });
    }
  });

  return (
    <Card>
      <title>Create an account · Barmkeep</title>
      <h1 className="mb-1 text-2xl font-semibold tracking-tight">Create an account</h1>
      <p className="mb-5 text-ink-muted">
        Keep a record of every culture: where it came from, how it was handled and how much of it is still alive.
      </p>
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormAlert message={errors.root?.server?.message}>
          {errors.root?.server?.type === 'email_taken' ? (
            <p className="mt-1 flex flex-wrap gap-x-4 text-sm">
              <Link to="/sign-in" className="text-accent underline underline-offset-4">
                Sign in
              </Link>
              <Link to="/forgot-password" className="text-accent underline underline-offset-4">
                Reset the password
              </Link>
            </p>
          ) : null}
        </FormAlert>
        <TextField
          label="Your name"
          hint="Shown to other members of your club."
          autoComplete="name"
          maxLength={limits.nameMax}
          error={errors.name?.message}
          {...register('name')}
        />
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
        <TextField
          label="Password"
          type="password"
          hint={`${limits.passwordMin} characters or more. A few unrelated words make a strong one.`}
          autoComplete="new-password"
          revealable
          error={errors.password?.message}
          {...register('password')}
        />
        <Button type="submit" className="w-full" busy={isSubmitting} busyLabel="Creating your account…">
          Create account
        </Button>
      </form>
      <p className="mt-5 border-t border-rule pt-4 text-sm">
        Already have an account?{' '}
        <Link
          to={next ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in'}
          className="text-accent underline underline-offset-4"
        >
          Sign in
        </Link>
      </p>
    </Card>
  );
}
