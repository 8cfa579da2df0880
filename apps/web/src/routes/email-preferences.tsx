import { useParams } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { EMAIL_DELIVERIES, type EmailDelivery } from '@barmkeep/schemas';
import { reminderQueries } from '../api/notifications/queries';
import { useSetEmailDeliveryMutation } from '../api/notifications/mutations';
import { isApiError } from '../api/client';
import { Button, Loading, Notice } from '../components';

const words: Record<EmailDelivery, { label: string; done: string }> = {
  each: { label: 'Each reminder as it comes', done: 'You will get an e-mail for each reminder.' },
  digest: { label: 'One digest a day', done: 'You will get one digest e-mail a day.' },
  none: {
    label: 'No reminder e-mail',
    done: 'Barmkeep will not e-mail you reminders. Notices still appear when you sign in.',
  },
};

/** Reached from the link in every reminder e-mail, signed in or not: the secret in the address is the key. */
export function Component() {
  const { token = '' } = useParams();
  const prefs = useQuery(reminderQueries.emailPreferences(token));
  const set = useSetEmailDeliveryMutation(token);
  return (
    <div className="space-y-5">
      <title>E-mail preferences · Barmkeep</title>
      <h1 className="text-2xl font-semibold tracking-tight">Reminder e-mail</h1>
      {prefs.isError ? (
        <Notice
          tone="danger"
          title={isApiError(prefs.error) && prefs.error.status === 404 ? 'This link does not work' : 'Could not load'}
        >
          {isApiError(prefs.error) && prefs.error.status === 404
            ? 'It may be from an old e-mail. Sign in and change reminders on your Account page.'
            : prefs.error.message}
        </Notice>
      ) : !prefs.data ? (
        <Loading />
      ) : (
        <>
          <p className="text-ink-muted">
            For <span className="font-medium text-ink">{prefs.data.emailHint}</span>. Now:{' '}
            <strong>{words[prefs.data.emailDelivery].label.toLowerCase()}</strong>.
          </p>
          <div className="flex flex-col gap-2">
            {EMAIL_DELIVERIES.map((d) => (
              <Button
                key={d}
                variant={d === 'none' ? 'secondary' : prefs.data.emailDelivery === d ? 'primary' : 'secondary'}
                aria-pressed={prefs.data.emailDelivery === d}
                disabled={set.isPending}
                onClick={() => set.mutate(d)}
              >
                {d === 'none' ? 'Stop reminder e-mail' : words[d].label}
              </Button>
            ))}
          </div>
          {set.isSuccess ? (
            <Notice tone="success" live="polite" word="Saved">
              {words[set.data.emailDelivery].done}
            </Notice>
          ) : null}
          {set.isError ? (
            <Notice tone="danger" live="assertive" title="Not saved">
              {set.error.message}
            </Notice>
          ) : null}
        </>
      )}
    </div>
  );
}
