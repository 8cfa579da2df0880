import { useEffect, useState } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import {
  CULTURE_FORMS,
  CultureCreateSchema,
  SPECIES_SUGGESTIONS,
  cultureLimits,
  limits,
  type CultureCreateData,
  type CultureCreateInput,
  type CultureForm,
  type CultureOrigin,
} from '@barmkeep/schemas';
import { cultureQueries } from '../../api/cultures/queries';
import { useCreateCultureMutation } from '../../api/cultures/mutations';
import { Button, Card, FormAlert, Notice, PageHeader, RadioGroup, Select, TextField } from '../../components';
import { applyApiError } from '../../lib/formErrors';
import { formLabels, originLabels } from '../../lib/cultureLabels';

const num = { setValueAs: (v: unknown) => (v === '' || v === null || v === undefined ? undefined : Number(v)) };
const optText = { setValueAs: (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v) };
const today = () => new Date().toISOString().slice(0, 10);

const FORMS_FOR: Record<CultureOrigin, readonly CultureForm[]> = {
  bottle_dregs: ['bottle_dregs'],
  purchased: ['liquid_pack', 'dry_pack', 'slant', 'plate', 'frozen_glycerol'],
  batch_slurry: ['slurry_unwashed', 'slurry_washed'],
  gift: CULTURE_FORMS,
  reculture: CULTURE_FORMS.filter((f) => f !== 'bottle_dregs'),
};

const DATE_LABEL: Record<CultureOrigin, string> = {
  bottle_dregs: 'Harvested on',
  purchased: 'Pack date (made on)',
  batch_slurry: 'Cropped on',
  gift: 'Harvested or made on',
  reculture: 'Grown or made on',
};

/** The guided bottle-sediment harvest, with the usual cautions. */
function DregsGuide() {
  const steps = [
    'Stand the bottle upright in the fridge for a day or two so the sediment settles.',
    'Clean, then sanitise the jar, its cover and the bottle’s neck. Follow the sanitiser’s label for dilution and contact time.',
    'Open the bottle and pour the beer off slowly, leaving about 1.3 cm (½ in) of beer over the sediment.',
    'Swirl the bottle to lift the sediment into the beer that is left.',
    'Pour it into the sanitised jar. Cover with sanitised foil or an airlock, not a tight lid.',
    'First feed: a small amount of cooled, low-gravity wort (about 1.020 SG, 5 °P). The starter planner works out the steps after that.',
  ];
  const [done, setDone] = useState<boolean[]>(() => steps.map(() => false));
  return (
    <Card className="space-y-4">
      <h2 className="text-lg font-semibold">Harvesting the sediment</h2>
      <ol className="space-y-2">
        {steps.map((s, i) => (
          <li key={i}>
            <label className="flex min-h-11 cursor-pointer items-start gap-3">
              <input
                type="checkbox"
                className="mt-1 size-4 accent-accent"
                checked={done[i]}
                onChange={() => setDone((d) => d.map((v, j) => (j === i ? !v : v)))}
              />
              <span className={done[i] ? 'text-ink-muted line-through' : undefined}>
                <span className="num mr-1">{i + 1}.</span>
                {s}
              </span>
            </label>
          </li>
        ))}
      </ol>
      <Notice tone="warning" title="Take care">
        <ul className="list-disc space-y-1 pl-5">
          <li>
            Never mix sanitisers or cleaners: chlorine bleach with acid or ammonia products gives off toxic gas. Wear
            gloves and eye protection as the label says.
          </li>
          <li>
            Growing yeast makes gas. A sealed jar or bottle can build pressure and burst; keep it loosely covered.
          </li>
          <li>Boiling wort scalds. Let it cool, covered, before it meets the yeast.</li>
          <li>Your local rules and the product’s label come first.</li>
        </ul>
      </Notice>
      <p className="text-sm text-ink-muted">
        Sediment from pasteurized beer is dead and will not grow; the label or the brewer can tell you.
      </p>
    </Card>
  );
}

function ParentSummary({ parentId }: { parentId: string }) {
  const { data, isError } = useQuery(cultureQueries.detail(parentId));
  if (isError) return <Notice tone="danger" title="The parent culture was not found" />;
  if (!data) return null;
  return (
    <Notice tone="info" word="Grown from">
      <Link className="text-accent underline" to={`/cultures/${data.id}`}>
        {data.strainName}
      </Link>{' '}
      (generation <span className="num">{data.generation}</span>, {formLabels[data.form]})
    </Notice>
  );
}

export function Component() {
  const [params] = useSearchParams();
  const parentId = params.get('parent') ?? undefined;
  const initialOrigin = (params.get('origin') as CultureOrigin | null) ?? (parentId ? 'reculture' : 'bottle_dregs');
  const navigate = useNavigate();
  const create = useCreateCultureMutation();
  const parent = useQuery({ ...cultureQueries.detail(parentId ?? ''), enabled: Boolean(parentId) });

  const {
    register,
    handleSubmit,
    setError,
    setValue,
    control,
    formState: { errors, isSubmitting },
  } = useForm<CultureCreateInput, unknown, CultureCreateData>({
    resolver: zodResolver(CultureCreateSchema),
    defaultValues: {
      origin: { origin: initialOrigin } as CultureCreateInput['origin'],
      form:
        initialOrigin === 'batch_slurry' ? 'slurry_unwashed' : initialOrigin === 'reculture' ? 'slant' : 'bottle_dregs',
      storageTempC: 4,
      madeAt: today(),
      state: 'stored',
      tags: [],
      ...(parentId ? { parentId } : {}),
    },
  });
  const origin = useWatch({ control, name: 'origin.origin' }) as CultureOrigin;
  const form = useWatch({ control, name: 'form' }) as CultureForm;
  const washed = useWatch({ control, name: 'origin.washed' as never }) as unknown as boolean | undefined;

  // Carry the parent's name and form over as a starting point.
  useEffect(() => {
    if (parent.data) {
      setValue('strainName', parent.data.strainName);
      if (parent.data.species) setValue('species', parent.data.species);
      setValue('tags', parent.data.tags);
    }
  }, [parent.data, setValue]);
  useEffect(() => {
    const allowed = FORMS_FOR[origin] ?? CULTURE_FORMS;
    if (!allowed.includes(form)) setValue('form', allowed[0]!);
    if (origin === 'batch_slurry' && washed !== undefined)
      setValue('form', washed ? 'slurry_washed' : 'slurry_unwashed');
  }, [origin, form, washed, setValue]);

  const err = (path: string) => {
    let node: unknown = errors;
    for (const p of path.split('.')) node = (node as Record<string, unknown> | undefined)?.[p];
    return (node as { message?: string } | undefined)?.message;
  };

  const onSubmit = handleSubmit(async (values) => {
    try {
      const culture = await create.mutateAsync({
        ...values,
        madeAt: values.madeAt.toISOString(),
        origin: Object.fromEntries(
          Object.entries(values.origin).map(([k, v]) => [k, v instanceof Date ? v.toISOString() : v]),
        ) as CultureCreateInput['origin'],
      });
      navigate(`/cultures/${culture.id}`);
    } catch (error) {
      applyApiError(
        error,
        setError as never,
        [
          'strainName',
          'species',
          'form',
          'storageTempC',
          'madeAt',
          'parentId',
          'generation',
          'locationLabel',
          'notes',
          'amount.volumeMl',
          'amount.packs',
          'amount.grams',
          'origin.beerName',
          'origin.bottleCount',
          'origin.pasteurized',
          'origin.bottledOn',
          'origin.maker',
          'origin.lot',
          'origin.manufacturedOn',
          'origin.bestBy',
          'origin.batchName',
          'origin.crop',
          'origin.washed',
          'origin.fromName',
        ] as never,
      );
    }
  });

  const originOptions = (
    parentId
      ? (['reculture', 'batch_slurry', 'gift'] as const)
      : (['bottle_dregs', 'purchased', 'batch_slurry', 'gift'] as const)
  ).map((o) => ({ value: o, label: originLabels[o] }));

  return (
    <>
      <title>Add a culture · Barmkeep</title>
      <PageHeader
        title={parentId ? 'Grow a new culture from this one' : 'Add a culture'}
        description="Where it came from, what it is in, and where you keep it."
      />
      <form onSubmit={onSubmit} noValidate className="space-y-6">
        <FormAlert message={errors.root?.server?.message} />
        {parentId ? <ParentSummary parentId={parentId} /> : null}
        <FormAlert message={err('parentId')} />

        <Card className="space-y-4">
          <RadioGroup
            legend="Where did it come from?"
            options={originOptions}
            error={err('origin.origin')}
            {...register('origin.origin')}
          />
        </Card>

        {origin === 'bottle_dregs' ? <DregsGuide /> : null}

        <Card className="space-y-4">
          <h2 className="text-lg font-semibold">Origin</h2>
          {origin === 'bottle_dregs' ? (
            <>
              <TextField
                label="Beer the sediment came from"
                maxLength={cultureLimits.labelMax}
                error={err('origin.beerName')}
                {...register('origin.beerName' as never)}
              />
              <TextField
                label="Brewed by (optional)"
                maxLength={cultureLimits.labelMax}
                error={err('origin.brewedBy')}
                {...register('origin.brewedBy' as never, optText)}
              />
              <TextField
                label="Bottles pooled"
                type="number"
                inputMode="numeric"
                min={1}
                max={cultureLimits.bottlesMax}
                defaultValue={1}
                error={err('origin.bottleCount')}
                {...register('origin.bottleCount' as never, num)}
              />
              <RadioGroup
                legend="Was the beer pasteurized?"
                options={[
                  { value: 'no', label: 'No, bottle-conditioned' },
                  { value: 'unknown', label: 'I don’t know' },
                  { value: 'yes', label: 'Yes', example: 'Its sediment is dead and will not grow.' },
                ]}
                error={err('origin.pasteurized')}
                {...register('origin.pasteurized' as never)}
              />
              <TextField
                label="Bottled on (optional)"
                type="date"
                error={err('origin.bottledOn')}
                {...register('origin.bottledOn' as never, optText)}
              />
            </>
          ) : null}
          {origin === 'purchased' ? (
            <>
              <TextField
                label="Maker"
                maxLength={cultureLimits.labelMax}
                error={err('origin.maker')}
                {...register('origin.maker' as never)}
              />
              <TextField
                label="Product code (optional)"
                maxLength={cultureLimits.lotMax}
                error={err('origin.productCode')}
                {...register('origin.productCode' as never, optText)}
              />
              <TextField
                label="Lot (optional)"
                maxLength={cultureLimits.lotMax}
                error={err('origin.lot')}
                {...register('origin.lot' as never, optText)}
              />
              <div className="grid gap-4 sm:grid-cols-2">
                <TextField
                  label="Manufactured on (optional)"
                  type="date"
                  error={err('origin.manufacturedOn')}
                  {...register('origin.manufacturedOn' as never, optText)}
                />
                <TextField
                  label="Best by (optional)"
                  type="date"
                  error={err('origin.bestBy')}
                  {...register('origin.bestBy' as never, optText)}
                />
              </div>
            </>
          ) : null}
          {origin === 'batch_slurry' ? (
            <>
              <TextField
                label="Batch it was cropped from"
                maxLength={cultureLimits.labelMax}
                error={err('origin.batchName')}
                {...register('origin.batchName' as never)}
              />
              <RadioGroup
                legend="Cropped from"
                options={[
                  { value: 'bottom', label: 'Bottom (after fermentation)' },
                  { value: 'top', label: 'Top (krausen)' },
                ]}
                error={err('origin.crop')}
                {...register('origin.crop' as never)}
              />
              <RadioGroup
                legend="Washed?"
                options={[
                  { value: 'false', label: 'No, under beer' },
                  { value: 'true', label: 'Yes, rinsed with boiled, cooled water' },
                ]}
                error={err('origin.washed')}
                {...register('origin.washed' as never, {
                  setValueAs: (v: unknown) => (v === 'true' ? true : v === 'false' ? false : v),
                })}
              />
            </>
          ) : null}
          {origin === 'gift' ? (
            <TextField
              label="Given by"
              maxLength={cultureLimits.labelMax}
              error={err('origin.fromName')}
              {...register('origin.fromName' as never)}
            />
          ) : null}
          {origin === 'reculture' ? (
            <Select
              label="How was it grown?"
              options={[
                { value: 'starter', label: 'In a starter' },
                { value: 'streak_plate', label: 'Streaked on a plate' },
                { value: 'slant', label: 'On a slant' },
                { value: 'freeze', label: 'Frozen in glycerol' },
                { value: 'other', label: 'Another way' },
              ]}
              {...register('origin.method' as never)}
            />
          ) : null}
        </Card>

        <Card className="space-y-4">
          <h2 className="text-lg font-semibold">The culture</h2>
          <TextField
            label="Strain name"
            hint="Your own name for it is fine."
            maxLength={cultureLimits.strainMax}
            error={err('strainName')}
            {...register('strainName')}
          />
          <TextField
            label="Species (optional)"
            list="species-suggestions"
            maxLength={cultureLimits.speciesMax}
            error={err('species')}
            {...register('species', optText)}
          />
          <datalist id="species-suggestions">
            {SPECIES_SUGGESTIONS.map((s) => (
              <option key={s} value={s} />
            ))}
          </datalist>
          <TextField
            label="Tags (optional)"
            hint="Separate with commas, e.g. saison, house"
            defaultValue={parent.data?.tags.join(', ')}
            onChange={(e) =>
              setValue(
                'tags',
                e.target.value
                  .split(',')
                  .map((t) => t.trim())
                  .filter(Boolean),
              )
            }
            error={err('tags')}
          />
          <Select
            label="Form"
            options={(FORMS_FOR[origin] ?? CULTURE_FORMS).map((f) => ({ value: f, label: formLabels[f] }))}
            error={err('form')}
            {...register('form')}
          />
          {form === 'slurry_washed' || form === 'slurry_unwashed' || form === 'frozen_glycerol' ? (
            <TextField
              label={form === 'frozen_glycerol' ? 'Vial volume (mL)' : 'Slurry volume (mL)'}
              type="number"
              inputMode="decimal"
              step="any"
              min={0}
              error={err('amount.volumeMl')}
              {...register('amount.volumeMl', num)}
            />
          ) : null}
          {form === 'liquid_pack' ? (
            <TextField
              label="Packs"
              type="number"
              inputMode="numeric"
              min={1}
              defaultValue={1}
              error={err('amount.packs')}
              {...register('amount.packs', num)}
            />
          ) : null}
          {form === 'dry_pack' ? (
            <TextField
              label="Weight (g)"
              type="number"
              inputMode="decimal"
              step="any"
              min={0}
              error={err('amount.grams')}
              {...register('amount.grams', num)}
            />
          ) : null}
          {!parentId ? (
            <TextField
              label="Generation (optional)"
              hint="How many batches it has fermented before it reached you. Leave empty for a fresh start (0)."
              type="number"
              inputMode="numeric"
              min={0}
              error={err('generation')}
              {...register('generation', num)}
            />
          ) : null}
        </Card>

        <Card className="space-y-4">
          <h2 className="text-lg font-semibold">Where and when</h2>
          <TextField
            label={DATE_LABEL[origin] ?? 'Made on'}
            type="date"
            max={today()}
            error={err('madeAt')}
            {...register('madeAt')}
          />
          <div className="grid gap-4 sm:grid-cols-2">
            <TextField
              label="Kept at (°C)"
              type="number"
              inputMode="decimal"
              step="any"
              error={err('storageTempC')}
              {...register('storageTempC', num)}
            />
            <TextField
              label="Place (optional)"
              placeholder="Fridge door, jar 2"
              maxLength={cultureLimits.locationMax}
              error={err('locationLabel')}
              {...register('locationLabel')}
            />
          </div>
          <RadioGroup
            legend="Right now it is"
            options={[
              { value: 'stored', label: 'Stored' },
              { value: 'active', label: 'Active, in a starter' },
            ]}
            {...register('state')}
          />
          <TextField label="Notes (optional)" maxLength={limits.notesMax} error={err('notes')} {...register('notes')} />
        </Card>

        <Button type="submit" busy={isSubmitting} busyLabel="Saving…">
          Add to the keep
        </Button>
      </form>
    </>
  );
}
