import { useState } from 'react';
import { useNavigate } from 'react-router';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { ClubCreateSchema, clubLimits } from '@barmkeep/schemas';
import { useDeleteClubMutation, useUpdateClubMutation } from '../api/clubs/mutations';
import { Button, Card, FormAlert, Notice, TextField } from '../components';
import { TextArea } from '../components/TextArea';
import { applyApiError } from '../lib/formErrors';
import { useClub } from './club';

const SettingsFormSchema = ClubCreateSchema.extend({ requestsNeedApproval: z.boolean() });

function DeleteClub() {
  const club = useClub();
  const navigate = useNavigate();
  const remove = useDeleteClubMutation(club.id);
  const [typed, setTyped] = useState('');
  return (
    <Card className="space-y-3 border-danger/60">
      <h2 className="text-lg font-semibold text-danger">Delete the club</h2>
      <p className="text-ink-muted">
        Removes the club, its memberships, its bank listings and its open invitations. Members keep their own cultures.
        This cannot be undone.
      </p>
      <TextField
        label={`Type the club’s name (${club.name}) to confirm`}
        value={typed}
        onChange={(e) => setTyped(e.target.value)}
        autoComplete="off"
      />
      {remove.isError ? (
        <Notice tone="danger" live="assertive" title="The club was not deleted">
          {remove.error.message}
        </Notice>
      ) : null}
      <Button
        variant="danger"
        disabled={typed.trim() !== club.name}
        busy={remove.isPending}
        busyLabel="Deleting…"
        onClick={() => remove.mutate(undefined, { onSuccess: () => void navigate('/clubs', { replace: true }) })}
      >
        Delete {club.name}
      </Button>
    </Card>
  );
}

export function Component() {
  const club = useClub();
  const update = useUpdateClubMutation(club.id);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting, isDirty, isSubmitSuccessful },
  } = useForm({
    resolver: zodResolver(SettingsFormSchema),
    defaultValues: { name: club.name, description: club.description, requestsNeedApproval: club.requestsNeedApproval },
  });

  if (club.myRole !== 'owner') {
    return <Notice tone="info" title="Only owners change the club’s settings" />;
  }

  const onSubmit = handleSubmit(async (values) => {
    try {
      const saved = await update.mutateAsync(values);
      reset({ name: saved.name, description: saved.description, requestsNeedApproval: saved.requestsNeedApproval });
    } catch (error) {
      applyApiError(error, setError, ['name', 'description', 'requestsNeedApproval']);
    }
  });

  return (
    <div className="space-y-6">
      <Card>
        <form onSubmit={onSubmit} noValidate className="space-y-4">
          <FormAlert message={errors.root?.server?.message} />
          <TextField
            label="Club name"
            maxLength={clubLimits.clubNameMax}
            error={errors.name?.message}
            {...register('name')}
          />
          <TextArea
            label="About the club"
            maxLength={clubLimits.clubDescriptionMax}
            rows={4}
            error={errors.description?.message}
            {...register('description')}
          />
          <label className="flex items-start gap-3">
            <input type="checkbox" className="mt-1 size-5 accent-accent" {...register('requestsNeedApproval')} />
            <span>
              <span className="font-medium">A steward approves each strain request first</span>
              <span className="block text-sm text-ink-muted">
                Otherwise a request goes straight to the member who keeps the culture.
              </span>
            </span>
          </label>
          <div className="flex flex-wrap items-center gap-3">
            <Button type="submit" busy={isSubmitting} busyLabel="Saving…" disabled={!isDirty}>
              Save settings
            </Button>
            {isSubmitSuccessful && !isDirty ? (
              <span role="status" className="text-sm text-accent-strong">
                Saved
              </span>
            ) : null}
          </div>
        </form>
      </Card>
      <DeleteClub />
    </div>
  );
}
