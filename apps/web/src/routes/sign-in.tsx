import { Link, useLocation, useNavigate, useSearchParams } from 'react-router';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { AuthSignInSchema } from '@barmkeep/schemas';
import { useSignInMutation } from '../api/auth/mutations';
import { Button, Card, FormAlert, Notice, TextField } from '../components';
import { applyApiError, safeNextPath } from '../lib/formErrors';

export type SignInNotice = 'password-reset' | 'account-created';

const notices: Record<SignInNotice, string> = {
  'password-reset': 'Your password is changed. Sign in with the new one.',
  'account-created': 'Your account is ready. Sign in to continue.',
};

export function Component() {
  const [searchParams] = useSearchParams();
  const location = useLocation();
  const navigate = useNavigate();
  const signIn = useSignInMutation();
  const next = safeNextPath(searchParams.get('next'));
  const notice = (location.state as { notice?: SignInNotice } | null)?.notice;

  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm({
    resolver: zodResolver(AuthSignInSchema),
    defaultValues: { email: '', password: '' },
  });

  const onSubmit = handleSubmit(async (values) => {
    try {
      await signIn.mutateAsync(values);
      await navigate(next ?? '/', { replace: true });
    } catch (error) {
      applyApiError(error, setError, ['email', 'password'], {
        rate_limited: 'Too many sign-in attempts. Wait a few minutes, then try again.',
      });
    }
  });

  return (
    <Card>
      <title>Sign in · Barmkeep</title>
      <h1 className="mb-1 text-2xl font-semibold tracking-tight">Sign in</h1>
      <p className="mb-5 text-ink-muted">
        {next ? 'Sign in to go on to the page you opened.' : 'Welcome back to your yeast notebook.'}
      </p>
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        {notice && notices[notice] ? (
          <Notice tone="success" live="polite">
            {notices[notice]}
          </Notice>
        ) : null}
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
        <TextField
          label="Password"
          type="password"
          autoComplete="current-password"
          revealable
          error={errors.password?.message}
          {...register('password')}
        />
        <Button type="submit" className="w-full" busy={isSubmitting} busyLabel="Signing in…">
          Sign in
        </Button>
      </form>
      <div className="mt-5 flex flex-col gap-2 border-t border-rule pt-4 text-sm sm:flex-row sm:justify-between">
        <Link to="/forgot-password" className="text-accent underline underline-offset-4">
          Forgot your password?
        </Link>
        <Link
          to={next ? `/sign-up?next=${encodeURIComponent(next)}` : '/sign-up'}
          className="text-accent underline underline-offset-4"
        >
          New here? Create an account
        </Link>
      </div>
    </Card>
  );
}
