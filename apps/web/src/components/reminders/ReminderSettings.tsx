import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import {
  NOTIFICATION_KINDS,
  NOTIFICATION_KIND_LABELS,
  NotificationPreferencesFormSchema,
  REMINDER_DEFAULTS,
  reminderLimits,
  type NotificationKind,
  type NotificationPreferencesDto,
} from '@barmkeep/schemas';
import { reminderQueries } from '../../api/notifications/queries';
import { useUpdateReminderPreferencesMutation } from '../../api/notifications/mutations';
import { applyApiError } from '../../lib/formErrors';
import { Button } from '../Button';
import { Card } from '../Card';
import { Loading } from '../Loading';
import { FormAlert, Notice } from '../Notice';
import { RadioGroup, type RadioOption } from '../RadioGroup';
import { TextField } from '../TextField';

const FormSchema = NotificationPreferencesFormSchema.omit({ mutedKinds: true });

const deliveryOptions: RadioOption[] = [
  { value: 'each', label: 'Each reminder as it comes' },
  { value: 'digest', label: 'One digest a day' },
  { value: 'none', label: 'No e-mail (notices stay in Barmkeep)' },
];

function Form({ prefs }: { prefs: NotificationPreferencesDto }) {
  const update = useUpdateReminderPreferencesMutation();
  const [muted, setMuted] = useState<NotificationKind[]>(prefs.mutedKinds);
  const [savedMuted, setSavedMuted] = useState<NotificationKind[]>(prefs.mutedKinds);
  const {
    register,
    handleSubmit,
    setError,
    control,
    reset,
    formState: { errors, isSubmitting, isDirty },
  } = useForm({
    resolver: zodResolver(FormSchema),
    defaultValues: {
      emailDelivery: prefs.emailDelivery,
      digestHour: prefs.digestHour,
      viabilityThresholdPct: prefs.viabilityThresholdPct,
      warnDays: prefs.warnDays,
      generationLimit: prefs.generationLimit,
      stepLeadHours: prefs.stepLeadHours,
    },
  });
  const delivery = useWatch({ control, name: 'emailDelivery' });
  const mutedChanged = [...muted].sort().join() !== [...savedMuted].sort().join();
  const onSubmit = handleSubmit(async (values) => {
    try {
      const saved = await update.mutateAsync({ ...values, mutedKinds: muted });
      reset({
        emailDelivery: saved.emailDelivery,
        digestHour: saved.digestHour,
        viabilityThresholdPct: saved.viabilityThresholdPct,
        warnDays: saved.warnDays,
        generationLimit: saved.generationLimit,
        stepLeadHours: saved.stepLeadHours,
      });
      setSavedMuted(saved.mutedKinds);
    } catch (error) {
      applyApiError(error, setError, [
        'emailDelivery',
        'digestHour',
        'viabilityThresholdPct',
        'warnDays',
        'generationLimit',
        'stepLeadHours',
      ]);
    }
  });
  const num = { valueAsNumber: true } as const;
  return (
    <form onSubmit={onSubmit} noValidate className="mt-8 space-y-4" aria-labelledby="reminders-heading">
      <Card className="space-y-5">
        <div>
          <h2 id="reminders-heading" className="text-lg font-semibold">
            Reminders
          </h2>
          <p className="text-sm text-ink-muted">
            When Barmkeep warns you about your cultures and plans. Times follow your time zone (
            {prefs.timeZone.replaceAll('_', ' ')}).
          </p>
        </div>
        <FormAlert message={errors.root?.server?.message} />
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField
            label="Viability threshold (%)"
            hint={`Warn when the projected viability falls below this. Default ${REMINDER_DEFAULTS.viabilityThresholdPct}%.`}
            type="number"
            inputMode="numeric"
            min={reminderLimits.thresholdMinPct}
            max={reminderLimits.thresholdMaxPct}
            error={errors.viabilityThresholdPct?.message}
            {...register('viabilityThresholdPct', num)}
          />
          <TextField
            label="Days of warning"
            hint={`How many days ahead to warn, and again on the day. Default ${REMINDER_DEFAULTS.warnDays}.`}
            type="number"
            inputMode="numeric"
            min={0}
            max={reminderLimits.warnDaysMax}
            error={errors.warnDays?.message}
            {...register('warnDays', num)}
          />
          <TextField
            label="Generation limit"
            hint={`Tell me when a culture reaches this generation. Default ${REMINDER_DEFAULTS.generationLimit} (re-culture after 10 is common practice).`}
            type="number"
            inputMode="numeric"
            min={1}
            max={reminderLimits.generationLimitMax}
            error={errors.generationLimit?.message}
            {...register('generationLimit', num)}
          />
          <TextField
            label="Hours before a starter step"
            hint={`Default ${REMINDER_DEFAULTS.stepLeadHours}: a morning notice for an evening step.`}
            type="number"
            inputMode="numeric"
            min={0}
            max={reminderLimits.stepLeadHoursMax}
            error={errors.stepLeadHours?.message}
            {...register('stepLeadHours', num)}
          />
        </div>
        <RadioGroup
          legend="E-mail"
          options={deliveryOptions}
          error={errors.emailDelivery?.message}
          {...register('emailDelivery')}
        />
        {delivery === 'digest' ? (
          <TextField
            label="Digest hour (0–23, your time)"
            type="number"
            inputMode="numeric"
            min={0}
            max={23}
            error={errors.digestHour?.message}
            {...register('digestHour', num)}
          />
        ) : null}
        <fieldset className="space-y-2">
          <legend className="text-sm font-medium">Remind me about</legend>
          {NOTIFICATION_KINDS.map((kind) => (
            <label key={kind} className="flex min-h-11 items-center gap-3">
              <input
                type="checkbox"
                className="size-5 accent-accent"
                checked={!muted.includes(kind)}
                onChange={(e) => setMuted((m) => (e.target.checked ? m.filter((k) => k !== kind) : [...m, kind]))}
              />
              <span>{NOTIFICATION_KIND_LABELS[kind]}</span>
            </label>
          ))}
        </fieldset>
      </Card>
      <div className="space-y-3">
        <Button type="submit" busy={isSubmitting} busyLabel="Saving…">
          Save reminders
        </Button>
        {isDirty || mutedChanged ? (
          <p className="text-sm text-ink-muted">You have unsaved changes.</p>
        ) : update.isSuccess ? (
          <Notice tone="success" live="polite" word="Saved">
            Your reminder settings are updated.
          </Notice>
        ) : null}
      </div>
    </form>
  );
}

export function ReminderSettings() {
  const { data } = useQuery(reminderQueries.preferences());
  return data ? <Form prefs={data} /> : <Loading />;
}
