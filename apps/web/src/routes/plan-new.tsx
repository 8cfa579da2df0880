import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { useQueries, useQuery } from '@tanstack/react-query';
import { useNavigate, useSearchParams } from 'react-router';
import { computeBrewPlan, PITCH_RATE_PRESETS, pitchRatePresetFor, sgFromPlato, type BrewPlan } from '@barmkeep/core';
import {
  BEER_TYPES,
  cultureCellsInputOf,
  makePlanCreateSchema,
  planningLimits,
  planEquipmentOf,
  type BeerType,
  type BrewPlanDto,
  type PlanCreateInput,
  type UserDto,
} from '@barmkeep/schemas';
import { authQueries } from '../api/auth/queries';
import { planningQueries } from '../api/planning/queries';
import { useCreatePlanMutation } from '../api/planning/mutations';
import { isApiError } from '../api/client';
import {
  Button,
  ButtonLink,
  Card,
  FormAlert,
  Loading,
  Notice,
  PageHeader,
  RadioGroup,
  Select,
  TextField,
} from '../components';
import { Cautions, PlanView } from '../components/planning/PlanView';
import { instantFromLocalInput, litresFromBatchInput, localInputOf, platoFromInput } from '../lib/planningFormat';

interface FormValues {
  name: string;
  purpose: 'batch' | 'grow';
  cultureIds: string[];
  volume: string;
  gravity: string;
  beerType: BeerType | '';
  customRate: string;
  targetBillions: string;
  brewLocal: string;
}

const FIELD_OF: Record<string, keyof FormValues> = {
  name: 'name',
  purpose: 'purpose',
  cultureIds: 'cultureIds',
  batchVolumeL: 'volume',
  ogPlato: 'gravity',
  beerType: 'beerType',
  customRate: 'customRate',
  targetCells: 'targetBillions',
  brewAt: 'brewLocal',
};

const beerLabels: Record<BeerType, string> = {
  ale: `Ale (${PITCH_RATE_PRESETS.ale.rate} M cells/mL/°P)`,
  lager: `Lager (${PITCH_RATE_PRESETS.lager.rate})`,
  highGravityAle: `High-gravity ale, over 1.060 (${PITCH_RATE_PRESETS.highGravityAle.rate})`,
  highGravityLager: `High-gravity lager, over 1.060 (${PITCH_RATE_PRESETS.highGravityLager.rate})`,
  custom: 'My own rate',
};

const num = (s: string) => (s.trim() === '' ? undefined : Number(s.replace(',', '.')));

function toInput(v: FormValues, user: UserDto, extraVesselsMl: number[]): PlanCreateInput {
  const brewAt = v.brewLocal ? instantFromLocalInput(v.brewLocal, user.timeZone) : null;
  const volume = num(v.volume);
  const gravity = num(v.gravity);
  const billions = num(v.targetBillions);
  return {
    name: v.name,
    purpose: v.purpose,
    cultureIds: v.cultureIds,
    ...(v.purpose === 'batch'
      ? {
          batchVolumeL: volume === undefined ? undefined : litresFromBatchInput(volume, user.unitSystem),
          ogPlato: gravity === undefined || Number.isNaN(gravity) ? gravity : platoFromInput(gravity, user.gravityUnit),
          beerType: v.beerType || undefined,
          customRate: v.beerType === 'custom' ? num(v.customRate) : undefined,
        }
      : { targetCells: billions === undefined ? undefined : billions * 1e9 }),
    ...(brewAt ? { brewAt: brewAt.toISOString() } : {}),
    extraVesselsMl,
  };
}

function toDto(plan: BrewPlan): BrewPlanDto {
  return JSON.parse(JSON.stringify(plan)) as BrewPlanDto;
}

function Planner({ user }: { user: UserDto }) {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const createPlan = useCreatePlanMutation();
  const [extraVesselsMl, setExtraVesselsMl] = useState<number[]>([]);
  const [submitted, setSubmitted] = useState(false);
  const [serverErrors, setServerErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | undefined>();
  const [defaultBrewLocal] = useState(
    () => localInputOf(new Date(Date.now() + 14 * 86_400_000), user.timeZone).slice(0, 11) + '09:00',
  );
  const equipment = useQuery(planningQueries.equipment());
  const cultures = useQuery(planningQueries.usableCultures());
  const { register, control, handleSubmit } = useForm<FormValues>({
    defaultValues: {
      name: '',
      purpose: params.get('purpose') === 'grow' ? 'grow' : 'batch',
      cultureIds: params.getAll('culture'),
      volume: '',
      gravity: '',
      beerType: '',
      customRate: '',
      targetBillions: '',
      brewLocal: defaultBrewLocal,
    },
  });
  const values = useWatch({ control }) as FormValues;
  const details = useQueries({
    queries: (values.cultureIds ?? []).map((id) => planningQueries.culture(id)),
  });

  const gravityLabel = user.gravityUnit === 'plato' ? 'Original gravity (°P)' : 'Original gravity (SG)';
  const volumeLabel = user.unitSystem === 'us' ? 'Batch volume (US gallons)' : 'Batch volume (litres)';

  // Live: the same parse and the same core call the API makes when it saves.
  const live: { errors: Record<string, string>; plan?: BrewPlanDto; pending?: boolean } = (() => {
    if (!equipment.data) return { errors: {} as Record<string, string> };
    const input = toInput(values, user, extraVesselsMl);
    const parsed = makePlanCreateSchema().safeParse({ ...input, name: input.name || 'draft' });
    const errors: Record<string, string> = {};
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const field = FIELD_OF[String(issue.path[0])];
        if (field && !errors[field]) errors[field] = issue.message;
      }
      // The schema checks °P; a person who types SG gets the same rule in SG.
      if (errors.gravity && user.gravityUnit === 'sg') {
        const lo = sgFromPlato(planningLimits.ogMinPlato).toFixed(3);
        const hi = sgFromPlato(planningLimits.ogMaxPlato).toFixed(3);
        errors.gravity = `Enter the original gravity as SG between ${lo} and ${hi}, e.g. 1.048`;
      }
      return { errors };
    }
    const d = details.map((q) => q.data);
    if (d.some((x) => !x)) return { errors, pending: true };
    const inputs = [];
    for (const c of d) {
      const r = cultureCellsInputOf(c!);
      if ('missing' in r) return { errors: { cultureIds: `${c!.strainName}: ${r.missing}` } };
      inputs.push(r.input);
    }
    const data = parsed.data;
    try {
      const plan = computeBrewPlan({
        now: new Date(),
        timeZone: user.timeZone,
        brewAt: data.brewAt ?? null,
        target:
          data.purpose === 'grow'
            ? { kind: 'cells', cells: data.targetCells! }
            : {
                kind: 'batch',
                volumeL: data.batchVolumeL!,
                plato: data.ogPlato!,
                rate: data.beerType === 'custom' ? data.customRate! : data.beerType!,
              },
        cultures: inputs,
        equipment: planEquipmentOf(equipment.data, extraVesselsMl),
        growthCorrection: equipment.data.growthCorrection.applied,
      });
      return { errors, plan: toDto(plan) };
    } catch (err) {
      return { errors: { form: err instanceof Error ? err.message : 'Cannot plan this' } };
    }
  })();

  // A field's own problem shows as soon as something is typed into it; empty fields wait for Save.
  const typedInto = (field: keyof FormValues) => {
    const v = values[field];
    return typeof v === 'string' && v.trim() !== '';
  };
  const shownError = (field: keyof FormValues) =>
    serverErrors[field] ?? (submitted || typedInto(field) ? live.errors[field] : undefined);
  const gravityNum = num(values.gravity ?? '');
  const suggested =
    values.purpose === 'batch' && gravityNum !== undefined && !Number.isNaN(gravityNum)
      ? pitchRatePresetFor({
          lager: values.beerType === 'lager' || values.beerType === 'highGravityLager',
          plato: platoFromInput(gravityNum, user.gravityUnit),
        })
      : null;

  const onSubmit = handleSubmit(async (v) => {
    setSubmitted(true);
    setServerErrors({});
    setFormError(undefined);
    if (Object.keys(live.errors).length || !v.name.trim()) {
      if (!v.name.trim()) setServerErrors({ name: 'Enter a name for the plan' });
      return;
    }
    try {
      const plan = await createPlan.mutateAsync(toInput(v, user, extraVesselsMl));
      navigate(`/plans/${plan.id}`);
    } catch (error) {
      if (isApiError(error)) {
        const mapped: Record<string, string> = {};
        for (const [k, msgs] of Object.entries(error.fields)) {
          const f = FIELD_OF[k.replace(/^body\./, '').split('.')[0]!];
          if (f) mapped[f] = msgs.join(' ');
          else setFormError(msgs.join(' '));
        }
        setServerErrors(mapped);
        if (!error.hasFieldErrors) setFormError(error.message);
      } else setFormError('Something unexpected went wrong. Try again.');
    }
  });

  if (equipment.isPending || cultures.isPending) return <Loading label="Loading your cultures and equipment" />;
  if (equipment.isError || cultures.isError)
    return <Notice tone="danger" title="Could not load your cultures or equipment" />;
  const usable = cultures.data;

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,22rem)_minmax(0,1fr)]">
      <form onSubmit={onSubmit} noValidate className="space-y-5" aria-label="Plan a starter">
        <FormAlert message={formError} />
        <Card className="space-y-4">
          <RadioGroup
            legend="What is this for?"
            options={[
              { value: 'batch', label: 'A batch on brew day' },
              { value: 'grow', label: 'Grow this culture to a pitchable size' },
            ]}
            {...register('purpose')}
          />
          <fieldset className="space-y-2">
            <legend className="font-medium">Culture (choose several to blend)</legend>
            {usable.length === 0 ? (
              <p className="text-ink-muted">
                No cultures in your library yet.{' '}
                <a className="text-accent underline" href="/cultures/new">
                  Add one
                </a>{' '}
                first.
              </p>
            ) : (
              <ul className="max-h-64 space-y-1 overflow-y-auto">
                {usable.map((c) => (
                  <li key={c.id}>
                    <label className="flex min-h-11 items-center gap-3 rounded-md px-2 hover:bg-paper-sunk">
                      <input
                        type="checkbox"
                        value={c.id}
                        className="size-5 accent-accent"
                        {...register('cultureIds')}
                      />
                      <span>
                        {c.strainName}{' '}
                        <span className="text-sm text-ink-muted">
                          · {c.form.replaceAll('_', ' ')} · generation <span className="num">{c.generation}</span>
                        </span>
                      </span>
                    </label>
                  </li>
                ))}
              </ul>
            )}
            {shownError('cultureIds') ? (
              <p className="text-sm text-danger" role="alert">
                {shownError('cultureIds')}
              </p>
            ) : null}
          </fieldset>
        </Card>

        <Card className="space-y-4">
          {values.purpose === 'batch' ? (
            <>
              <TextField label={volumeLabel} inputMode="decimal" error={shownError('volume')} {...register('volume')} />
              <TextField
                label={gravityLabel}
                inputMode="decimal"
                hint={user.gravityUnit === 'plato' ? 'e.g. 12' : 'e.g. 1.048'}
                error={shownError('gravity')}
                {...register('gravity')}
              />
              <Select
                label="Kind of beer (sets the pitch rate)"
                options={[
                  { value: '', label: 'Choose…' },
                  ...BEER_TYPES.map((b) => ({ value: b, label: beerLabels[b] })),
                ]}
                hint={
                  suggested && values.beerType !== suggested ? `For this gravity: ${beerLabels[suggested]}` : undefined
                }
                error={shownError('beerType')}
                {...register('beerType')}
              />
              {values.beerType === 'custom' ? (
                <TextField
                  label="Pitch rate (million cells per mL per °P)"
                  inputMode="decimal"
                  hint="Rates in use run from about 0.35 to 2.0."
                  error={shownError('customRate')}
                  {...register('customRate')}
                />
              ) : null}
            </>
          ) : (
            <TextField
              label="Viable cells wanted (billions)"
              inputMode="decimal"
              hint="e.g. 200 for a 20 L ale at 1.048"
              error={shownError('targetBillions')}
              {...register('targetBillions')}
            />
          )}
          <TextField
            label={values.purpose === 'batch' ? 'Brew day and time' : 'Wanted by (optional)'}
            type="datetime-local"
            hint={`In ${user.timeZone.replaceAll('_', ' ')}`}
            error={shownError('brewLocal')}
            {...register('brewLocal')}
          />
          {extraVesselsMl.length ? (
            <p className="text-sm text-ink-muted">
              Extra vessels for this plan:{' '}
              <span className="num">{extraVesselsMl.map((v) => `${v} mL`).join(', ')}</span>{' '}
              <button type="button" className="text-accent underline" onClick={() => setExtraVesselsMl([])}>
                remove
              </button>
            </p>
          ) : null}
          <p className="text-sm text-ink-muted">
            Using your equipment: {equipment.data.vessels.map((v) => `${v.volumeMl} mL`).join(', ')};{' '}
            {equipment.data.stirPlate
              ? 'stir plate'
              : equipment.data.withoutStirPlate === 'shake'
                ? 'shaken, no stir plate'
                : 'left still'}
            .{' '}
            <a href="/account#equipment" className="text-accent underline">
              Change
            </a>
          </p>
        </Card>

        <Card className="space-y-4">
          <TextField label="Name of the plan" maxLength={120} error={shownError('name')} {...register('name')} />
          <Button type="submit" busy={createPlan.isPending} busyLabel="Saving…" className="w-full">
            Save plan
          </Button>
        </Card>
      </form>

      <div className="min-w-0 space-y-5" aria-live="polite">
        {live.plan ? (
          <PlanView
            plan={live.plan}
            units={user}
            onAddVessel={(ml) => setExtraVesselsMl((v) => (v.includes(ml) ? v : [...v, ml]))}
          />
        ) : (
          <Card>
            <p className="text-ink-muted">
              {live.pending
                ? 'Loading the culture…'
                : 'Choose a culture and fill in the batch: the ladder appears here and changes as you type.'}
            </p>
            {live.errors.form ? <p className="mt-2 text-danger">{live.errors.form}</p> : null}
          </Card>
        )}
        <Cautions />
      </div>
    </div>
  );
}

export function Component() {
  const me = useQuery(authQueries.me());
  if (!me.data) return <Loading label="Loading" />;
  return (
    <>
      <PageHeader
        title="Plan a starter"
        description="How many cells you need, how many you have, and the steps in between."
        actions={
          <ButtonLink to="/plans" variant="secondary">
            Your plans
          </ButtonLink>
        }
      />
      <Planner user={me.data} />
    </>
  );
}
