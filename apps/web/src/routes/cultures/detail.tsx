import { lazy, Suspense, useState, type FormEvent } from 'react';
import { Link, useNavigate, useParams } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { Camera, GitFork, Network, Pencil, ShieldAlert, Trash2, TriangleAlert } from 'lucide-react';
import {
  CORRECTABLE_EVENT_KINDS,
  CULTURE_STATES,
  LOGGABLE_EVENT_KINDS,
  IN_USE_STATES,
  type CultureDetailDto,
  type CultureEventCreateInput,
  type CultureEventDto,
  type CultureState,
} from '@barmkeep/schemas';
import { cultureQueries } from '../../api/cultures/queries';
import {
  useAddEventMutation,
  useChangeStateMutation,
  useDeletePhotoMutation,
  useQuarantineMutation,
  useSplitMutation,
  useUploadPhotoMutation,
} from '../../api/cultures/mutations';
import { isApiError } from '../../api/client';
import {
  Button,
  ButtonLink,
  Card,
  FormAlert,
  Loading,
  Notice,
  PageHeader,
  Select,
  TextField,
  cx,
} from '../../components';
import {
  actionLabels,
  canBePitched,
  eventLabels,
  formatCells,
  formatDate,
  formLabels,
  originLabels,
  pct,
  stateLabels,
} from '../../lib/cultureLabels';
import { formatDateTime } from '../../lib/format';
import { OfferInClub } from '../../components/clubs/OfferInClub';
import { EditDetails } from './EditDetails';
import { readableSource } from '../../lib/sources';

const ViabilityChart = lazy(() => import('./ViabilityChart'));

function errorText(error: unknown): string | undefined {
  if (!error) return undefined;
  if (isApiError(error)) {
    const fields = Object.values(error.fields).flat();
    return fields.length ? fields.join(' ') : error.message;
  }
  return 'Something unexpected went wrong. Try again.';
}

function Fact({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div>
      <dt className="text-sm text-ink-muted">{label}</dt>
      <dd className="font-medium">{children}</dd>
    </div>
  );
}

function OriginFacts({ c }: { c: CultureDetailDto }) {
  const o = c.originDetails;
  switch (o.origin) {
    case 'bottle_dregs':
      return (
        <>
          <Fact label="Beer">
            {o.beerName}
            {o.brewedBy ? `, by ${o.brewedBy}` : ''}
          </Fact>
          <Fact label="Bottles pooled">
            <span className="num">{o.bottleCount}</span>
          </Fact>
          <Fact label="Pasteurized">
            {o.pasteurized === 'yes' ? 'Yes' : o.pasteurized === 'no' ? 'No' : 'Not known'}
          </Fact>
        </>
      );
    case 'purchased':
      return (
        <>
          <Fact label="Maker">{o.maker}</Fact>
          {o.lot ? <Fact label="Lot">{o.lot}</Fact> : null}
          {o.bestBy ? <Fact label="Best by">{formatDate(o.bestBy)}</Fact> : null}
        </>
      );
    case 'batch_slurry':
      return (
        <>
          <Fact label="Batch">{o.batchName}</Fact>
          <Fact label="Crop">
            {o.crop === 'top' ? 'Top' : 'Bottom'}, {o.washed ? 'washed' : 'unwashed'}
          </Fact>
        </>
      );
    case 'gift':
      return <Fact label="Given by">{o.fromName}</Fact>;
    case 'reculture':
      return <Fact label="Grown by">{o.method.replace('_', ' ')}</Fact>;
  }
}

function Health({ c }: { c: CultureDetailDto }) {
  const h = c.health;
  const series = useQuery(cultureQueries.health(c.id));
  return (
    <Card className="space-y-4">
      <h2 className="text-lg font-semibold">Health today</h2>
      <dl className="grid grid-cols-2 gap-4 sm:grid-cols-3">
        <Fact
          label={
            h.viabilityBasis === 'measured'
              ? 'Viability (from your stain, projected)'
              : 'Viability (projected from form and age)'
          }
        >
          <span className="num text-xl">{pct(h.viability)}</span>
        </Fact>
        <Fact label={h.cells?.kind === 'estimate' ? 'Live cells — estimate' : 'Live cells'}>
          {h.cells ? (
            <span className="num text-xl">{formatCells(h.cells.viable)}</span>
          ) : (
            <span className="text-ink-muted">—</span>
          )}
        </Fact>
        <Fact label="Needs attention">
          {IN_USE_STATES.includes(c.state) ? (
            <span className={cx(h.storage.daysLeft <= 3 && 'text-warn', h.storage.daysLeft < 0 && 'text-danger')}>
              {h.storage.daysLeft < 0 ? `${-h.storage.daysLeft} days overdue` : `in ${h.storage.daysLeft} days`}:{' '}
              {actionLabels[h.storage.action] ?? h.storage.action}
            </span>
          ) : (
            'No longer kept'
          )}
        </Fact>
      </dl>
      {h.cells ? (
        <p className="text-sm text-ink-muted">
          {h.cells.kind === 'estimate' ? 'Estimate: ' : 'From your count: '}
          total <span className="num">{formatCells(h.cells.total)}</span> (range{' '}
          <span className="num">{formatCells(h.cells.low)}</span>–
          <span className="num">{formatCells(h.cells.high)}</span>). {readableSource(h.cells.basis)}
        </p>
      ) : h.cellsMissing ? (
        <p className="text-sm text-ink-muted">{h.cellsMissing}</p>
      ) : null}
      {h.outOfRange && h.note ? (
        <Notice tone="warning" title="Outside the model’s range">
          {h.note}
        </Notice>
      ) : null}
      {h.generationAdvice.level !== 'ok' ? (
        <Notice tone={h.generationAdvice.level === 'stop' ? 'danger' : 'warning'} title={`Generation ${c.generation}`}>
          {h.generationAdvice.message}
        </Notice>
      ) : null}
      {series.data ? (
        <Suspense fallback={<Loading label="Drawing the chart…" />}>
          <ViabilityChart data={series.data} />
        </Suspense>
      ) : (
        <Loading label="Loading the projection…" />
      )}
      <details className="text-sm text-ink-muted">
        <summary className="cursor-pointer">How this is worked out</summary>
        <p className="mt-1">
          Model: {h.model}. {readableSource(h.source)}
        </p>
      </details>
    </Card>
  );
}

const KIND_OPTIONS = LOGGABLE_EVENT_KINDS.map((k) => ({ value: k, label: eventLabels[k] }));

function numOrUndef(v: FormDataEntryValue | null) {
  if (v === null || v === '') return undefined;
  return Number(v);
}

/** One form for every kind of log entry; only the fields of the chosen kind are shown. */
function AddEntry({
  c,
  correcting,
  onDone,
}: {
  c: CultureDetailDto;
  correcting?: CultureEventDto;
  onDone: () => void;
}) {
  const add = useAddEventMutation(c.id);
  const [kind, setKind] = useState<string>(correcting?.kind ?? 'note');
  const d = (correcting?.data ?? {}) as Record<string, unknown>;
  const submit = async (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    const data: Record<string, unknown> = {};
    if (kind === 'counted') {
      Object.assign(data, {
        cellsCounted: numOrUndef(f.get('cellsCounted')),
        squaresCounted: numOrUndef(f.get('squaresCounted')),
        dilution: numOrUndef(f.get('dilution')),
        live: numOrUndef(f.get('live')),
        dead: numOrUndef(f.get('dead')),
        cultureVolumeMl: numOrUndef(f.get('cultureVolumeMl')),
      });
    } else if (kind === 'fed') {
      Object.assign(data, { volumeMl: numOrUndef(f.get('volumeMl')), tempC: numOrUndef(f.get('tempC')) });
      const g = numOrUndef(f.get('gravity'));
      if (g !== undefined) data.gravity = { value: g, unit: g > 1.5 ? 'plato' : 'sg' };
    } else if (kind === 'moved') {
      const loc = String(f.get('locationLabel') ?? '');
      if (loc) data.locationLabel = loc;
      const t = numOrUndef(f.get('storageTempC'));
      if (t !== undefined) data.storageTempC = t;
    } else if (kind === 'pitched') {
      Object.assign(data, { batchName: String(f.get('batchName') ?? ''), usedUp: f.get('usedUp') === 'on' });
    } else if (kind === 'observation') {
      data.aspect = String(f.get('aspect') ?? 'other');
    }
    const when = String(f.get('occurredAt') ?? '');
    const input = {
      kind,
      notes: String(f.get('notes') ?? ''),
      data,
      ...(when ? { occurredAt: new Date(when).toISOString() } : {}),
      ...(correcting ? { supersedesEventId: correcting.id } : {}),
    } as CultureEventCreateInput;
    try {
      await add.mutateAsync(input);
      e.currentTarget?.reset();
      onDone();
    } catch {
      /* shown below */
    }
  };
  return (
    <form
      onSubmit={submit}
      noValidate
      className="space-y-3 rounded-md border border-rule bg-paper p-4"
      aria-label={correcting ? 'Correct a log entry' : 'Add to the log'}
    >
      {correcting ? (
        <Notice tone="info" word="Correcting">
          {eventLabels[correcting.kind]} of {formatDateTime(correcting.occurredAt)}. The old entry stays in the log,
          marked as corrected.
        </Notice>
      ) : (
        <Select label="What happened?" options={KIND_OPTIONS} value={kind} onChange={(e) => setKind(e.target.value)} />
      )}
      {kind === 'counted' ? (
        <>
          <p className="text-sm text-ink-muted">
            Hemocytometer: medium squares (0.2 mm) of an improved Neubauer chamber. Include the stain in the dilution
            factor.
          </p>
          <div className="grid grid-cols-3 gap-3">
            <TextField
              label="Cells counted"
              name="cellsCounted"
              type="number"
              inputMode="numeric"
              defaultValue={d.cellsCounted as number | undefined}
            />
            <TextField
              label="Squares"
              name="squaresCounted"
              type="number"
              inputMode="numeric"
              defaultValue={(d.squaresCounted as number | undefined) ?? 5}
            />
            <TextField
              label="Dilution ×"
              name="dilution"
              type="number"
              inputMode="decimal"
              step="any"
              defaultValue={(d.dilution as number | undefined) ?? 100}
            />
          </div>
          <p className="text-sm text-ink-muted">Stain (optional): cells left clear are alive, stained ones dead.</p>
          <div className="grid grid-cols-2 gap-3">
            <TextField
              label="Live (clear)"
              name="live"
              type="number"
              inputMode="numeric"
              defaultValue={d.live as number | undefined}
            />
            <TextField
              label="Dead (stained)"
              name="dead"
              type="number"
              inputMode="numeric"
              defaultValue={d.dead as number | undefined}
            />
          </div>
          <TextField
            label="Volume of the whole culture (mL, optional)"
            hint="Turns cells per mL into total cells."
            name="cultureVolumeMl"
            type="number"
            inputMode="decimal"
            step="any"
            defaultValue={(d.cultureVolumeMl as number | undefined) ?? c.amount.volumeMl}
          />
        </>
      ) : null}
      {kind === 'fed' ? (
        <>
          <div className="grid grid-cols-3 gap-3">
            <TextField label="Wort (mL)" name="volumeMl" type="number" inputMode="decimal" step="any" />
            <TextField label="Gravity (SG or °P)" name="gravity" type="number" inputMode="decimal" step="any" />
            <TextField label="Temp (°C)" name="tempC" type="number" inputMode="decimal" step="any" />
          </div>
          <p className="text-sm text-warn">
            Boiling wort scalds: cool it, covered, before feeding. Keep the vessel loosely covered so gas can escape.
          </p>
        </>
      ) : null}
      {kind === 'moved' ? (
        <div className="grid grid-cols-2 gap-3">
          <TextField label="New place" name="locationLabel" defaultValue={c.locationLabel} />
          <TextField
            label="Kept at (°C)"
            name="storageTempC"
            type="number"
            inputMode="decimal"
            step="any"
            defaultValue={c.storageTempC}
          />
        </div>
      ) : null}
      {kind === 'pitched' ? (
        <>
          <TextField label="Into batch" name="batchName" />
          <label className="flex items-center gap-2">
            <input type="checkbox" name="usedUp" defaultChecked className="size-4 accent-accent" /> All of it went in
          </label>
        </>
      ) : null}
      {kind === 'observation' ? (
        <Select
          label="About its"
          name="aspect"
          options={[
            { value: 'smell', label: 'Smell' },
            { value: 'appearance', label: 'Look' },
            { value: 'taste', label: 'Taste' },
            { value: 'other', label: 'Other' },
          ]}
        />
      ) : null}
      <TextField label="When (leave empty for now)" name="occurredAt" type="datetime-local" />
      <TextField label="Notes" name="notes" defaultValue={correcting?.notes} />
      <FormAlert message={errorText(add.error)} />
      <div className="flex gap-2">
        <Button type="submit" busy={add.isPending} busyLabel="Saving…">
          {correcting ? 'Save correction' : 'Add to the log'}
        </Button>
        {correcting ? (
          <Button variant="quiet" onClick={onDone}>
            Cancel
          </Button>
        ) : null}
      </div>
    </form>
  );
}

const DETAIL_NAMES: Record<string, string> = { strainName: 'Name', species: 'Species', tags: 'Tags', notes: 'Notes' };
const shown = (v: unknown) => {
  const s = Array.isArray(v) ? v.join(', ') : v === null || v === undefined ? '' : String(v);
  return s === '' ? '—' : s;
};

/** "Name: Jar 4 → Jar 4 saison" for each field a details edit changed (long notes are shortened). */
function detailsChange(d: Record<string, unknown>): string {
  const from = (d.from ?? {}) as Record<string, unknown>;
  const to = (d.to ?? {}) as Record<string, unknown>;
  const cut = (s: string) => (s.length > 60 ? `${s.slice(0, 57)}…` : s);
  // stored as JSONB, whose key order is not the order written: show them in the form's order
  return Object.keys(DETAIL_NAMES)
    .filter((k) => k in to)
    .map((k) => `${DETAIL_NAMES[k] ?? k}: ${cut(shown(from[k]))} → ${cut(shown(to[k]))}`)
    .join('; ');
}

/** Entries the app wrote for a details or parent edit: history, not something to correct. */
const isRecordOfEdit = (e: CultureEventDto) => e.kind === 'note' && typeof e.data.change === 'string';

function describe(e: CultureEventDto): string | null {
  const d = e.data as Record<string, unknown>;
  const r = d.result as { cellsPerMl?: number; viability?: number; warnings?: string[] } | undefined;
  switch (e.kind) {
    case 'counted':
      return r
        ? `${formatCells(r.cellsPerMl ?? 0)} cells/mL${r.viability !== undefined ? `, ${pct(r.viability)} alive` : ''}`
        : null;
    case 'fed':
      return `${d.volumeMl} mL of wort`;
    case 'moved':
      return [d.locationLabel, d.storageTempC !== undefined ? `${d.storageTempC} °C` : null].filter(Boolean).join(', ');
    case 'pitched':
      return `into ${d.batchName}`;
    case 'state_changed':
      return `${stateLabels[d.from as CultureState]} → ${stateLabels[d.to as CultureState]}`;
    case 'split':
      return `into ${(d.childIds as string[]).length} parts`;
    case 'contamination_confirmed':
      return `${(d.flaggedIds as string[]).length} descendants flagged`;
    case 'note':
      return d.change === 'details' ? detailsChange(d) : null;
    default:
      return null;
  }
}

function Log({ c }: { c: CultureDetailDto }) {
  const { data: events } = useQuery(cultureQueries.events(c.id));
  const [correcting, setCorrecting] = useState<CultureEventDto | undefined>();
  return (
    <Card className="space-y-4">
      <h2 className="text-lg font-semibold">Handling log</h2>
      {!events ? (
        <Loading />
      ) : (
        <ol className="space-y-3 border-l-2 border-rule pl-4">
          {[...events].reverse().map((e) => (
            <li key={e.id} className={cx('space-y-0.5', e.supersededByEventId && 'opacity-60')}>
              <p className="font-medium">
                {eventLabels[e.kind]}
                {e.supersedesEventId ? <span className="ml-2 text-sm text-ink-muted">(correction)</span> : null}
                {e.supersededByEventId ? (
                  <span className="ml-2 text-sm text-ink-muted line-through">corrected</span>
                ) : null}
              </p>
              <p className="text-sm text-ink-muted">
                {formatDateTime(e.occurredAt)}
                {e.author ? ` · ${e.author.name}` : ''}
              </p>
              {describe(e) ? <p className={cx('text-sm', !isRecordOfEdit(e) && 'num')}>{describe(e)}</p> : null}
              {e.notes ? <p className="text-sm">{e.notes}</p> : null}
              {CORRECTABLE_EVENT_KINDS.includes(e.kind) &&
              !e.supersededByEventId &&
              e.kind !== 'harvested' &&
              !isRecordOfEdit(e) ? (
                <Button variant="quiet" className="min-h-9 px-1 text-sm" onClick={() => setCorrecting(e)}>
                  Correct
                </Button>
              ) : null}
            </li>
          ))}
        </ol>
      )}
      {correcting ? (
        <AddEntry key={correcting.id} c={c} correcting={correcting} onDone={() => setCorrecting(undefined)} />
      ) : (
        <AddEntry c={c} onDone={() => undefined} />
      )}
    </Card>
  );
}

function Photos({ c }: { c: CultureDetailDto }) {
  const { data: photos } = useQuery(cultureQueries.photos(c.id));
  const upload = useUploadPhotoMutation(c.id);
  const remove = useDeletePhotoMutation(c.id);
  const submit = async (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const form = e.currentTarget;
    const f = new FormData(form);
    const file = f.get('photo');
    if (!(file instanceof File) || file.size === 0) return;
    try {
      await upload.mutateAsync({ file, caption: String(f.get('caption') ?? '') });
      form.reset();
    } catch {
      /* shown below */
    }
  };
  return (
    <Card className="space-y-4">
      <h2 className="text-lg font-semibold">Photos</h2>
      {photos && photos.length > 0 ? (
        <ul className="grid grid-cols-2 gap-3 sm:grid-cols-4">
          {photos.map((p) => (
            <li key={p.id} className="space-y-1">
              <a href={p.webUrl} target="_blank" rel="noreferrer">
                <img
                  src={p.thumbUrl}
                  alt={p.caption || 'Photo of the culture'}
                  width={160}
                  height={Math.round((160 * p.height) / p.width)}
                  className="w-full rounded border border-rule"
                  loading="lazy"
                />
              </a>
              <p className="text-sm text-ink-muted">{p.caption || formatDate(p.createdAt)}</p>
              <Button
                variant="quiet"
                className="min-h-9 px-1 text-sm"
                icon={<Trash2 aria-hidden className="size-4" />}
                onClick={() => remove.mutate(p.id)}
              >
                Remove
              </Button>
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-ink-muted">No photos yet. Sediment, krausen or a microscope field all help later.</p>
      )}
      <form onSubmit={submit} className="space-y-3" aria-label="Upload a photo">
        <TextField
          label="Photo"
          name="photo"
          type="file"
          accept="image/*"
          capture="environment"
          hint="Up to 15 MB. Location and camera details are removed."
        />
        <TextField label="Caption (optional)" name="caption" maxLength={200} />
        <FormAlert message={errorText(upload.error)} />
        <Button
          type="submit"
          variant="secondary"
          icon={<Camera aria-hidden className="size-5" />}
          busy={upload.isPending}
          busyLabel="Uploading…"
        >
          Upload
        </Button>
      </form>
    </Card>
  );
}

function Quarantine({ c, onClose }: { c: CultureDetailDto; onClose: () => void }) {
  const preview = useQuery(cultureQueries.quarantinePreview(c.id));
  const quarantine = useQuarantineMutation(c.id);
  const [unchecked, setUnchecked] = useState<Set<string>>(new Set());
  const [notes, setNotes] = useState('');
  if (!preview.data) return <Loading label="Finding descendants…" />;
  const list = preview.data;
  return (
    <div
      className="space-y-3 rounded-md border border-danger bg-danger-soft/40 p-4"
      role="region"
      aria-label="Confirm contamination"
    >
      <p className="font-semibold">Confirm contamination of {c.strainName}</p>
      <p className="text-sm">
        It will be quarantined.{' '}
        {list.length
          ? `These ${list.length} descendants are still in use; the ticked ones will be flagged as suspect:`
          : 'No descendant is still in use.'}
      </p>
      {list.length ? (
        <ul className="max-h-64 space-y-1 overflow-y-auto">
          {list.map((d) => (
            <li key={d.id}>
              <label className="flex min-h-9 items-center gap-2">
                <input
                  type="checkbox"
                  className="size-4 accent-danger"
                  checked={!unchecked.has(d.id)}
                  onChange={() =>
                    setUnchecked((s) => {
                      const n = new Set(s);
                      if (n.has(d.id)) n.delete(d.id);
                      else n.add(d.id);
                      return n;
                    })
                  }
                />
                <span style={{ paddingLeft: `${(d.depth - 1) * 12}px` }}>{d.strainName}</span>
                <span className="num text-sm text-ink-muted">
                  gen {d.generation} · {stateLabels[d.state]}
                </span>
              </label>
            </li>
          ))}
        </ul>
      ) : null}
      <p className="text-sm">
        Cultures grown from it that other people keep, through a club or a gift, are flagged as suspect too, and each of
        their keepers is told.
      </p>
      <TextField label="What did you see? (optional)" value={notes} onChange={(e) => setNotes(e.target.value)} />
      <p className="text-sm text-ink-muted">
        Dispose of contaminated cultures as your local rules say; sanitise everything they touched.
      </p>
      <FormAlert message={errorText(quarantine.error)} />
      <div className="flex gap-2">
        <Button
          variant="danger"
          busy={quarantine.isPending}
          onClick={async () => {
            await quarantine.mutateAsync({
              notes,
              flagDescendantIds: list.map((d) => d.id).filter((id) => !unchecked.has(id)),
            });
            onClose();
          }}
        >
          Quarantine{list.length ? ` and flag ${list.length - unchecked.size}` : ''}
        </Button>
        <Button variant="secondary" onClick={onClose}>
          Cancel
        </Button>
      </div>
    </div>
  );
}

function Actions({ c }: { c: CultureDetailDto }) {
  const navigate = useNavigate();
  const change = useChangeStateMutation(c.id);
  const split = useSplitMutation(c.id);
  const [state, setState] = useState<CultureState>(c.state === 'stored' ? 'active' : 'stored');
  const [parts, setParts] = useState('2');
  const [quarantining, setQuarantining] = useState(false);
  const kept = IN_USE_STATES.includes(c.state);
  return (
    <Card className="space-y-4">
      <h2 className="text-lg font-semibold">Actions</h2>
      {c.state !== 'discarded' ? (
        <div className="flex flex-wrap gap-2">
          <ButtonLink
            to={`/cultures/new?parent=${c.id}`}
            variant="secondary"
            icon={<GitFork aria-hidden className="size-5" />}
          >
            Re-culture
          </ButtonLink>
          <ButtonLink to={`/cultures/new?parent=${c.id}&origin=batch_slurry`} variant="secondary">
            Harvest from a batch
          </ButtonLink>
          {canBePitched(c) ? (
            <ButtonLink to={`/batches/new?cultureId=${c.id}`} variant="secondary">
              Pitch into a batch
            </ButtonLink>
          ) : null}
          <ButtonLink
            to={`/cultures/${c.id}/lineage`}
            variant="secondary"
            icon={<Network aria-hidden className="size-5" />}
          >
            Lineage
          </ButtonLink>
          <ButtonLink to={`/batches/generations?cultureId=${c.id}`} variant="quiet">
            Batches by generation
          </ButtonLink>
        </div>
      ) : (
        <ButtonLink
          to={`/cultures/${c.id}/lineage`}
          variant="secondary"
          icon={<Network aria-hidden className="size-5" />}
        >
          Lineage
        </ButtonLink>
      )}
      {c.state !== 'discarded' ? (
        <form
          className="grid gap-3 sm:grid-cols-[1fr_auto] sm:items-end"
          onSubmit={(e) => {
            e.preventDefault();
            change.mutate({ state });
          }}
        >
          <Select
            label="Change state to"
            value={state}
            onChange={(e) => setState(e.target.value as CultureState)}
            options={CULTURE_STATES.filter((s) => s !== c.state).map((s) => ({ value: s, label: stateLabels[s] }))}
          />
          <Button type="submit" variant="secondary" busy={change.isPending}>
            Change
          </Button>
        </form>
      ) : null}
      {c.suspect ? (
        <Button variant="secondary" onClick={() => change.mutate({ state: c.state, clearSuspect: true })}>
          I checked it: lift the suspect flag
        </Button>
      ) : null}
      <FormAlert message={errorText(change.error)} />
      {kept ? (
        <form
          className="grid gap-3 sm:grid-cols-[1fr_auto] sm:items-end"
          onSubmit={async (e) => {
            e.preventDefault();
            try {
              const kids = await split.mutateAsync({ count: Number(parts) });
              navigate(`/cultures/${kids[0]!.id}`);
            } catch {
              /* shown */
            }
          }}
        >
          <TextField
            label="Split into parts"
            type="number"
            inputMode="numeric"
            min={2}
            max={20}
            value={parts}
            onChange={(e) => setParts(e.target.value)}
          />
          <Button type="submit" variant="secondary" busy={split.isPending}>
            Split
          </Button>
        </form>
      ) : null}
      <FormAlert message={errorText(split.error)} />
      {c.state !== 'discarded' && c.state !== 'quarantined' ? (
        quarantining ? (
          <Quarantine c={c} onClose={() => setQuarantining(false)} />
        ) : (
          <Button
            variant="danger"
            icon={<ShieldAlert aria-hidden className="size-5" />}
            onClick={() => setQuarantining(true)}
          >
            Contamination confirmed…
          </Button>
        )
      ) : null}
    </Card>
  );
}

export function Component() {
  const { id = '' } = useParams();
  const { data: c, isError, error } = useQuery(cultureQueries.detail(id));
  // the culture being edited, so moving to another culture's page closes the form
  const [editingId, setEditingId] = useState<string | null>(null);
  if (isError) {
    return (
      <Notice
        tone="danger"
        title={
          isApiError(error) && error.status === 404
            ? 'No culture of yours has this address'
            : 'Could not load this culture'
        }
      >
        <Link to="/cultures" className="text-accent underline">
          Back to the library
        </Link>
      </Notice>
    );
  }
  if (!c) return <Loading />;
  return (
    <>
      <title>{`${c.strainName} · Barmkeep`}</title>
      <PageHeader
        title={c.strainName}
        description={`Label ${c.labelCode} · ${formLabels[c.form]} · ${stateLabels[c.state]} · generation ${c.generation}`}
      />
      <div className="space-y-6">
        {c.suspect && c.suspectFrom ? (
          <Notice tone="danger" title="Suspected contamination" live="polite">
            {c.suspectFrom.id === c.id ? (
              'You flagged this culture. '
            ) : (
              <>
                Contamination was confirmed in an ancestor,{' '}
                <Link className="underline" to={`/cultures/${c.suspectFrom.id}`}>
                  {c.suspectFrom.strainName}
                </Link>
                , on {formatDate(c.suspectFrom.since)}.{' '}
              </>
            )}
            Keep it apart and check it before you pitch it.
          </Notice>
        ) : null}
        {c.warnings
          .filter((w) => !c.suspect || !/contamination/i.test(w))
          .map((w) => (
            <Notice key={w} tone="warning">
              <span className="inline-flex items-start gap-1">
                <TriangleAlert aria-hidden className="mt-1 size-4 shrink-0" />
                {w}
              </span>
            </Notice>
          ))}
        <Card>
          {editingId === c.id ? (
            <EditDetails key={c.id} c={c} onDone={() => setEditingId(null)} />
          ) : (
            <>
              <dl className="grid grid-cols-2 gap-4 sm:grid-cols-3">
                <Fact label="Origin">{originLabels[c.origin]}</Fact>
                <OriginFacts c={c} />
                <Fact label={c.origin === 'purchased' ? 'Made on' : 'Harvested or made'}>
                  {formatDate(c.madeAt)} (<span className="num">{c.ageDays}</span> d)
                </Fact>
                <Fact label="Kept">
                  {c.locationLabel ? `${c.locationLabel}, ` : ''}
                  <span className="num">{c.storageTempC} °C</span>
                </Fact>
                {c.parent ? (
                  <Fact label="Grown from">
                    {c.parent.openable ? (
                      <Link className="text-accent underline" to={`/cultures/${c.parent.id}`}>
                        {c.parent.strainName}
                      </Link>
                    ) : c.parent.strainName ? (
                      <>
                        {c.parent.strainName}, kept by {c.parent.keeperName ?? 'a fellow member'} (
                        <Link className="text-accent underline" to={`/cultures/${c.id}/lineage`}>
                          see the lineage
                        </Link>
                        )
                      </>
                    ) : (
                      <span className="text-ink-muted">a culture not shared with you</span>
                    )}
                  </Fact>
                ) : null}
                <Fact label="State since">
                  {formatDateTime(c.stateChangedAt)}
                  {c.stateChangedBy ? `, by ${c.stateChangedBy.name}` : ''}
                </Fact>
                {c.species ? (
                  <Fact label="Species">
                    <i>{c.species}</i>
                  </Fact>
                ) : null}
                {c.tags.length ? <Fact label="Tags">{c.tags.join(', ')}</Fact> : null}
              </dl>
              {c.notes ? <p className="mt-4 whitespace-pre-line">{c.notes}</p> : null}
              <Button
                variant="secondary"
                className="mt-4"
                icon={<Pencil aria-hidden className="size-5" />}
                onClick={() => setEditingId(c.id)}
              >
                Edit details
              </Button>
            </>
          )}
        </Card>
        <Health c={c} />
        <Actions c={c} />
        <OfferInClub culture={c} />
        <Log c={c} />
        <Photos c={c} />
      </div>
    </>
  );
}
