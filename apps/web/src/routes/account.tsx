import { useMemo } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { AccountPasswordChangeSchema, AccountUpdateSchema, limits, type UserDto } from '@barmkeep/schemas';
import { authQueries } from '../api/auth/queries';
import { useChangePasswordMutation, useUpdateAccountMutation } from '../api/account/mutations';
import {
  Button,
  Card,
  FormAlert,
  Loading,
  Notice,
  PageHeader,
  RadioGroup,
  Select,
  TextField,
  type RadioOption,
  type SelectOption,
} from '../components';
import { applyApiError } from '../lib/formErrors';
import { ReminderSettings } from '../components/reminders/ReminderSettings';
import { CalendarFeedSettings } from '../components/reminders/CalendarFeedSettings';
import { EquipmentSection } from '../components/planning/EquipmentSection';

/** On the account page every setting is required; the API also accepts partial updates. */
const AccountFormSchema = AccountUpdateSchema.required();

const unitSystemOptions: RadioOption[] = [
  { value: 'metric', label: 'Metric', example: <span className="num">1.5 L · 12 g</span> },
  { value: 'us', label: 'US customary', example: <span className="num">0.4 gal · 0.42 oz</span> },
];
const temperatureOptions: RadioOption[] = [
  { value: 'C', label: 'Celsius', example: <span className="num">20 °C</span> },
  { value: 'F', label: 'Fahrenheit', example: <span className="num">68 °F</span> },
];
const gravityOptions: RadioOption[] = [
  { value: 'sg', label: 'Specific gravity', example: <span className="num">1.048</span> },
  { value: 'plato', label: 'Degrees Plato', example: <span className="num">11.9 °P</span> },
];

function deviceTimeZone(): string | undefined {
  try {
    return Intl.DateTimeFormat().resolvedOptions().timeZone;
  } catch {
    return undefined;
  }
}

function timeZoneOptions(current: string): SelectOption[] {
  const zones = new Set(Intl.supportedValuesOf('timeZone'));
  zones.add('UTC');
  zones.add(current);
  return [...zones].sort().map((zone) => ({ value: zone, label: zone.replaceAll('_', ' ') }));
}

function AccountForm({ user }: { user: UserDto }) {
  const updateAccount = useUpdateAccountMutation();
  const zones = useMemo(() => timeZoneOptions(user.timeZone), [user.timeZone]);
  const deviceZone = deviceTimeZone();
  const memberSince = new Intl.DateTimeFormat(undefined, { dateStyle: 'long', timeZone: user.timeZone }).format(
    new Date(user.createdAt),
  );

  const {
    register,
    handleSubmit,
    setError,
    setValue,
    reset,
    control,
    formState: { errors, isSubmitting, isDirty },
  } = useForm({
    resolver: zodResolver(AccountFormSchema),
    defaultValues: {
      name: user.name,
      unitSystem: user.unitSystem,
      temperatureUnit: user.temperatureUnit,
      gravityUnit: user.gravityUnit,
      timeZone: user.timeZone,
    },
  });
  const chosenZone = useWatch({ control, name: 'timeZone' });

  const onSubmit = handleSubmit(async (values) => {
    try {
      const { user: saved } = await updateAccount.mutateAsync(values);
      reset({
        name: saved.name,
        unitSystem: saved.unitSystem,
        temperatureUnit: saved.temperatureUnit,
        gravityUnit: saved.gravityUnit,
        timeZone: saved.timeZone,
      });
    } catch (error) {
      applyApiError(error, setError, ['name', 'unitSystem', 'temperatureUnit', 'gravityUnit', 'timeZone']);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6">
      <FormAlert message={errors.root?.server?.message} />

      <Card className="space-y-4">
        <h2 className="text-lg font-semibold">Profile</h2>
        <TextField
          label="Name"
          hint="Shown to members of your clubs."
          autoComplete="name"
          maxLength={limits.nameMax}
          error={errors.name?.message}
          {...register('name')}
        />
        <div className="space-y-1.5">
          <p className="text-sm font-medium">E-mail</p>
          <p className="break-all text-ink-muted">{user.email}</p>
        </div>
        <p className="text-sm text-ink-muted">Member since {memberSince}</p>
      </Card>

      <Card className="space-y-5">
        <div>
          <h2 className="text-lg font-semibold">Units</h2>
          <p className="text-sm text-ink-muted">How volumes, weights, temperatures and gravities are shown to you.</p>
        </div>
        <RadioGroup
          legend="Volume and weight"
          options={unitSystemOptions}
          error={errors.unitSystem?.message}
          {...register('unitSystem')}
        />
        <RadioGroup
          legend="Temperature"
          options={temperatureOptions}
          error={errors.temperatureUnit?.message}
          {...register('temperatureUnit')}
        />
        <RadioGroup
          legend="Gravity"
          options={gravityOptions}
          error={errors.gravityUnit?.message}
          {...register('gravityUnit')}
        />
      </Card>

      <Card className="space-y-3">
        <h2 className="text-lg font-semibold">Time</h2>
        <Select
          label="Time zone"
          hint="Reminders and dates follow this zone."
          options={zones}
          error={errors.timeZone?.message}
          {...register('timeZone')}
        />
        {deviceZone && deviceZone !== chosenZone && zones.some((zone) => zone.value === deviceZone) ? (
          <Button
            variant="quiet"
            className="px-2"
            onClick={() => setValue('timeZone', deviceZone, { shouldDirty: true, shouldValidate: true })}
          >
            Use this device’s zone ({deviceZone.replaceAll('_', ' ')})
          </Button>
        ) : null}
      </Card>

      <div className="space-y-3">
        <Button type="submit" busy={isSubmitting} busyLabel="Saving…">
          Save changes
        </Button>
        {isDirty ? (
          <p className="text-sm text-ink-muted">You have unsaved changes.</p>
        ) : updateAccount.isSuccess ? (
          <Notice tone="success" live="polite" word="Saved">
            Your settings are updated.
          </Notice>
        ) : null}
      </div>
    </form>
  );
}

/** Changing the password signs the account out of every other browser and device. */
function PasswordForm() {
  const changePassword = useChangePasswordMutation();
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm({
    resolver: zodResolver(AccountPasswordChangeSchema),
    defaultValues: { currentPassword: '', newPassword: '' },
  });
  const onSubmit = handleSubmit(async (values) => {
    try {
      await changePassword.mutateAsync(values);
      reset({ currentPassword: '', newPassword: '' });
    } catch (error) {
      applyApiError(error, setError, ['currentPassword', 'newPassword']);
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="mt-8 space-y-4" aria-labelledby="password-heading">
      <Card className="space-y-4">
        <div>
          <h2 id="password-heading" className="text-lg font-semibold">
            Password
          </h2>
          <p className="text-sm text-ink-muted">
            A new password signs you out on every other browser and phone. This one stays signed in.
          </p>
        </div>
        <FormAlert message={errors.root?.server?.message} />
        <TextField
          label="Current password"
          type="password"
          autoComplete="current-password"
          revealable
          error={errors.currentPassword?.message}
          {...register('currentPassword')}
        />
        <TextField
          label="New password"
          type="password"
          autoComplete="new-password"
          hint={`At least ${limits.passwordMin} characters.`}
          maxLength={limits.passwordMax}
          revealable
          error={errors.newPassword?.message}
          {...register('newPassword')}
        />
      </Card>
      <div className="space-y-3">
        <Button type="submit" busy={isSubmitting} busyLabel="Changing…">
          Change password
        </Button>
        {changePassword.isSuccess ? (
          <Notice tone="success" live="polite" word="Changed">
            Your password is changed and every other session is signed out.
          </Notice>
        ) : null}
      </div>
    </form>
  );
}

export function Component() {
  const { data: user } = useQuery(authQueries.me());
  return (
    <>
      <title>Account · Barmkeep</title>
      <PageHeader title="Account" description="Your name, and how Barmkeep shows numbers to you." />
      {user ? (
        <>
          <AccountForm user={user} />
          <PasswordForm />
          <ReminderSettings />
          <CalendarFeedSettings />
          <EquipmentSection user={user} />
        </>
      ) : (
        <Loading />
      )}
    </>
  );
}
