import { useDeferredValue, useMemo, useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import {
  CultureUpdateSchema,
  SPECIES_SUGGESTIONS,
  cultureLimits,
  limits,
  type CultureDetailDto,
  type CultureOrigin,
  type CultureUpdateInput,
} from '@barmkeep/schemas';
import { cultureQueries } from '../../api/cultures/queries';
import { useUpdateCultureMutation } from '../../api/cultures/mutations';
import { Button, FormAlert, Notice, Select, TextArea, TextField, type SelectOption } from '../../components';
import { applyApiError } from '../../lib/formErrors';
import { formatDate, formLabels } from '../../lib/cultureLabels';

/** The API's lineage rules (services/cultureLineage.ts), so the form offers only what it accepts. */
const ROOT_ONLY: readonly CultureOrigin[] = ['bottle_dregs', 'purchased'];
const PARENT_REQUIRED: readonly CultureOrigin[] = ['reculture'];

const NO_PARENT = '';
const FIELDS = ['strainName', 'species', 'tags', 'notes', 'parentId'] as const;

type Values = CultureUpdateInput;

function sameTags(a: readonly string[], b: readonly string[]) {
  return a.length === b.length && a.every((t, i) => t === b[i]);
}

/** Only what differs from the culture as loaded goes to the API (PATCH takes any subset). */
export function changedFields(c: CultureDetailDto, v: Values, parentEditable: boolean): CultureUpdateInput {
  const out: CultureUpdateInput = {};
  if (v.strainName !== undefined && v.strainName !== c.strainName) out.strainName = v.strainName;
  const species = v.species ? v.species : null;
  if (v.species !== undefined && species !== c.species) out.species = species;
  if (v.tags !== undefined && !sameTags(v.tags, c.tags)) out.tags = v.tags;
  if (v.notes !== undefined && v.notes !== c.notes) out.notes = v.notes;
  if (parentEditable && v.parentId !== undefined && v.parentId !== c.parentId) out.parentId = v.parentId;
  return out;
}

/** Ids of `rootId` and everything grown from it, from the lineage nodes. */
function subtreeOf(nodes: { id: string; parentId: string | null }[], rootId: string): Set<string> {
  const children = new Map<string, string[]>();
  for (const n of nodes) {
    if (!n.parentId) continue;
    const list = children.get(n.parentId) ?? [];
    list.push(n.id);
    children.set(n.parentId, list);
  }
  const out = new Set<string>([rootId]);
  const stack = [rootId];
  while (stack.length) {
    for (const child of children.get(stack.pop()!) ?? []) {
      if (out.has(child)) continue;
      out.add(child);
      stack.push(child);
    }
  }
  return out;
}

function ParentField({
  c,
  value,
  error,
  onChange,
}: {
  c: CultureDetailDto;
  value: string | null | undefined;
  error?: string;
  onChange: (parentId: string | null) => void;
}) {
  const [search, setSearch] = useState('');
  const q = useDeferredValue(search.trim());
  const candidates = useQuery(cultureQueries.list({ q: q || undefined, sort: 'name', dir: 'asc', pageSize: 50 }));
  const lineage = useQuery(cultureQueries.lineage(c.id));
  // this culture and its descendants would close a loop: never offered (the API refuses them too)
  const below = useMemo(() => subtreeOf(lineage.data?.nodes ?? [], c.id), [lineage.data, c.id]);
  const required = PARENT_REQUIRED.includes(c.origin);
  const currentName = lineage.data?.nodes.find((n) => n.id === c.parentId)?.strainName;

  const options: SelectOption[] = required
    ? value
      ? []
      : [{ value: NO_PARENT, label: 'Choose the culture it was grown from' }]
    : [{ value: NO_PARENT, label: 'No parent: it starts a lineage' }];
  const seen = new Set(options.map((o) => o.value));
  if (c.parentId && !seen.has(c.parentId)) {
    options.push({ value: c.parentId, label: `${currentName ?? 'The current parent'} (current)` });
    seen.add(c.parentId);
  }
  for (const r of candidates.data?.cultures ?? []) {
    if (below.has(r.id) || seen.has(r.id)) continue;
    seen.add(r.id);
    options.push({
      value: r.id,
      label: `${r.strainName} · gen ${r.generation} · ${formLabels[r.form]} · ${formatDate(r.madeAt)}`,
    });
  }
  // a choice made before the search changed stays selectable
  if (value && !seen.has(value)) options.push({ value, label: 'The culture you chose' });

  return (
    <fieldset className="space-y-3 rounded-md border border-rule p-3">
      <legend className="px-1 font-medium">Parent culture</legend>
      <TextField
        label="Find a culture"
        type="search"
        hint="Your cultures, by strain, species or tag. Cultures grown from this one are not offered."
        value={search}
        onChange={(e) => setSearch(e.target.value)}
      />
      <Select
        label="Grown from"
        hint={
          required
            ? 'A re-culture needs the culture it was grown from.'
            : 'Optional: the culture this one was harvested or given from.'
        }
        options={options}
        value={value ?? NO_PARENT}
        error={error}
        onChange={(e) => onChange(e.target.value === NO_PARENT ? null : e.target.value)}
      />
      <p className="text-sm text-ink-muted">
        Changing the parent works the generation out again for this culture and everything grown from it, and records
        the change in the handling log.
      </p>
    </fieldset>
  );
}

/** Name, species, tags, notes and the parent of a culture; every change is also written to its log. */
export function EditDetails({ c, onDone }: { c: CultureDetailDto; onDone: () => void }) {
  const update = useUpdateCultureMutation(c.id);
  const parentEditable = !ROOT_ONLY.includes(c.origin);
  const [nothingChanged, setNothingChanged] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    setValue,
    control,
    formState: { errors, isSubmitting },
  } = useForm<Values>({
    resolver: zodResolver(CultureUpdateSchema),
    defaultValues: {
      strainName: c.strainName,
      species: c.species ?? '',
      tags: c.tags,
      notes: c.notes,
      parentId: c.parentId,
    },
  });
  const parentId = useWatch({ control, name: 'parentId' });
  const tagsError =
    errors.tags?.message ?? (Array.isArray(errors.tags) ? errors.tags.find((e) => e?.message)?.message : undefined);

  const onSubmit = handleSubmit(async (values) => {
    const changes = changedFields(c, values, parentEditable);
    if (Object.keys(changes).length === 0) {
      setNothingChanged(true);
      return;
    }
    try {
      await update.mutateAsync(changes);
      onDone();
    } catch (error) {
      applyApiError(error, setError, FIELDS);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Edit details">
      <h2 className="text-lg font-semibold">Edit details</h2>
      <FormAlert message={errors.root?.server?.message} />
      {nothingChanged ? (
        <Notice tone="info" live="polite">
          Nothing differs from what is saved.
        </Notice>
      ) : null}
      <TextField
        label="Strain name"
        maxLength={cultureLimits.strainMax}
        error={errors.strainName?.message}
        {...register('strainName')}
      />
      <TextField
        label="Species (optional)"
        list="edit-species-suggestions"
        maxLength={cultureLimits.speciesMax}
        error={errors.species?.message}
        {...register('species')}
      />
      <datalist id="edit-species-suggestions">
        {SPECIES_SUGGESTIONS.map((s) => (
          <option key={s} value={s} />
        ))}
      </datalist>
      <TextField
        label="Tags (optional)"
        hint="Separate with commas, e.g. saison, house"
        defaultValue={c.tags.join(', ')}
        error={tagsError}
        onChange={(e) =>
          setValue(
            'tags',
            e.target.value
              .split(',')
              .map((t) => t.trim())
              .filter(Boolean),
            { shouldDirty: true },
          )
        }
      />
      <TextArea
        label="Notes (optional)"
        maxLength={limits.notesMax}
        rows={4}
        error={errors.notes?.message}
        {...register('notes')}
      />
      {parentEditable ? (
        <ParentField
          c={c}
          value={parentId}
          error={errors.parentId?.message}
          onChange={(id) => setValue('parentId', id, { shouldDirty: true })}
        />
      ) : (
        <p className="text-sm text-ink-muted">
          Bottle dregs and bought yeast start a lineage of their own, so they have no parent culture.
        </p>
      )}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={isSubmitting} busyLabel="Saving…">
          Save details
        </Button>
        <Button variant="quiet" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
