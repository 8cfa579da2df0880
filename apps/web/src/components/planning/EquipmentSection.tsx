import { useState } from 'react';
import { useFieldArray, useForm, useWatch } from 'react-hook-form';
import { useQuery } from '@tanstack/react-query';
import { Plus, Trash2 } from 'lucide-react';
import { platoFromSg, sgFromPlato } from '@barmkeep/core';
import { planningLimits, type EquipmentDto, type UserDto } from '@barmkeep/schemas';
import { planningQueries } from '../../api/planning/queries';
import { useSaveEquipmentMutation } from '../../api/planning/mutations';
import { isApiError } from '../../api/client';
import { Button, Card, FormAlert, Loading, Notice, RadioGroup, TextField } from '..';
import { millilitresFromVesselInput, vesselInputOf } from '../../lib/planningFormat';

interface Values {
  vessels: { label: string; volume: string }[];
  stirPlate: 'yes' | 'no';
  withoutStirPlate: 'shake' | 'still';
  starterGravity: string;
  maxStepFactor: string;
  coldCrashHours: string;
  growthCorrectionOptIn: boolean;
}

function EquipmentForm({ equipment, user }: { equipment: EquipmentDto; user: UserDto }) {
  const save = useSaveEquipmentMutation();
  const [saved, setSaved] = useState(false);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | undefined>();
  const sgUnit = user.gravityUnit === 'plato';
  const volUnit = user.unitSystem === 'us' ? 'fl oz' : 'mL';
  const { register, control, handleSubmit } = useForm<Values>({
    defaultValues: {
      vessels: equipment.vessels.map((v) => ({
        label: v.label,
        volume: String(vesselInputOf(v.volumeMl, user.unitSystem)),
      })),
      stirPlate: equipment.stirPlate ? 'yes' : 'no',
      withoutStirPlate: equipment.withoutStirPlate,
      starterGravity: sgUnit ? equipment.starterPlato.toFixed(1) : sgFromPlato(equipment.starterPlato).toFixed(3),
      maxStepFactor: String(equipment.maxStepFactor),
      coldCrashHours: String(equipment.coldCrashHours),
      growthCorrectionOptIn: equipment.growthCorrectionOptIn,
    },
  });
  const { fields, append, remove } = useFieldArray({ control, name: 'vessels' });
  const stir = useWatch({ control, name: 'stirPlate' });
  const onSubmit = handleSubmit(async (v) => {
    setSaved(false);
    setErrors({});
    setFormError(undefined);
    const g = Number(v.starterGravity.replace(',', '.'));
    try {
      await save.mutateAsync({
        vessels: v.vessels.map((x) => ({
          label: x.label,
          volumeMl: Math.round(millilitresFromVesselInput(Number(x.volume.replace(',', '.')), user.unitSystem)),
        })),
        stirPlate: v.stirPlate === 'yes',
        withoutStirPlate: v.withoutStirPlate,
        starterPlato: sgUnit ? g : platoFromSg(g),
        maxStepFactor: Number(v.maxStepFactor),
        coldCrashHours: Number(v.coldCrashHours),
        growthCorrectionOptIn: v.growthCorrectionOptIn,
      });
      setSaved(true);
    } catch (err) {
      if (isApiError(err)) {
        const f: Record<string, string> = {};
        for (const [k, m] of Object.entries(err.fields)) f[k.replace(/^body\./, '')] = m.join(' ');
        setErrors(f);
        setFormError(err.message);
      } else setFormError('Something unexpected went wrong. Try again.');
    }
  });
  const gc = equipment.growthCorrection;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5" aria-label="Starter equipment">
      <FormAlert message={formError} />
      <fieldset className="space-y-3">
        <legend className="font-medium">Flasks and jars (working volume, leave headroom for foam)</legend>
        {errors.vessels ? <p className="text-sm text-danger">{errors.vessels}</p> : null}
        <ul className="space-y-2">
          {fields.map((f, i) => (
            <li key={f.id} className="grid grid-cols-[1fr_7rem_auto] items-end gap-2">
              <TextField label={`Name ${i + 1}`} {...register(`vessels.${i}.label`)} />
              <TextField
                label={`Volume (${volUnit})`}
                inputMode="decimal"
                error={errors[`vessels.${i}.volumeMl`]}
                {...register(`vessels.${i}.volume`)}
              />
              <Button
                variant="quiet"
                aria-label={`Remove vessel ${i + 1}`}
                onClick={() => remove(i)}
                disabled={fields.length <= 1}
              >
                <Trash2 aria-hidden className="size-5" />
              </Button>
            </li>
          ))}
        </ul>
        {fields.length < planningLimits.vesselsMax ? (
          <Button
            variant="secondary"
            icon={<Plus aria-hidden className="size-5" />}
            onClick={() => append({ label: '', volume: '' })}
          >
            Add a vessel
          </Button>
        ) : null}
      </fieldset>
      <RadioGroup
        legend="Stir plate"
        options={[
          { value: 'yes', label: 'I have a stir plate' },
          { value: 'no', label: 'No stir plate' },
        ]}
        {...register('stirPlate')}
      />
      {stir === 'no' ? (
        <RadioGroup
          legend="Without one, the starter is"
          options={[
            { value: 'shake', label: 'Shaken now and then' },
            { value: 'still', label: 'Left still' },
          ]}
          {...register('withoutStirPlate')}
        />
      ) : null}
      <div className="grid gap-3 sm:grid-cols-3">
        <TextField
          label={`Starter gravity (${sgUnit ? '°P' : 'SG'})`}
          hint="For steps after the first; 1.036 is 100 g extract per litre."
          inputMode="decimal"
          error={errors.starterPlato}
          {...register('starterGravity')}
        />
        <TextField
          label="Largest step (× the last volume)"
          inputMode="decimal"
          error={errors.maxStepFactor}
          {...register('maxStepFactor')}
        />
        <TextField
          label="Chill and decant (hours before brewing)"
          inputMode="numeric"
          error={errors.coldCrashHours}
          {...register('coldCrashHours')}
        />
      </div>
      <div className="space-y-2 rounded-md border border-rule p-3">
        <label className="flex min-h-11 items-center gap-3">
          <input type="checkbox" className="size-5 accent-accent" {...register('growthCorrectionOptIn')} />
          Use my growth correction in new plans
        </label>
        <p className="text-sm text-ink-muted">
          {gc.steps === 0 ? (
            'No counted steps yet. Count a finished starter and Barmkeep compares it with the prediction.'
          ) : (
            <>
              From <span className="num">{gc.steps}</span> counted {gc.steps === 1 ? 'step' : 'steps'} your starters
              grew <span className="num">{gc.ratio.toFixed(2)}</span>× the new cells the model predicts (geometric mean
              of measured ÷ predicted). {gc.optedIn ? 'New plans use it.' : 'New plans ignore it until you opt in.'}
            </>
          )}
        </p>
      </div>
      {saved ? <Notice tone="success" live="polite" title="equipment saved" /> : null}
      <Button type="submit" busy={save.isPending} busyLabel="Saving…">
        Save equipment
      </Button>
    </form>
  );
}

/** The starter-kit part of the account page. */
export function EquipmentSection({ user }: { user: UserDto }) {
  const q = useQuery(planningQueries.equipment());
  return (
    <Card className="mt-6 space-y-4" id="equipment">
      <div>
        <h2 className="text-lg font-semibold">Starter equipment</h2>
        <p className="text-sm text-ink-muted">What the step-up planner may use.</p>
      </div>
      {q.isPending ? (
        <Loading />
      ) : q.isError ? (
        <Notice tone="danger" title={q.error.message} />
      ) : (
        <EquipmentForm equipment={q.data} user={user} />
      )}
    </Card>
  );
}
