import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { CultureDetailDto, CultureSummaryDto, LineageNodeDto } from '@barmkeep/schemas';
import { cultureKeys } from '../../api/cultures/queries';
import { jsonResponse, renderPage } from '../../test/render';
import { EditDetails } from './EditDetails';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  fetchMock.mockReset();
  vi.stubGlobal('fetch', fetchMock);
});
afterEach(() => {
  vi.unstubAllGlobals();
});

const culture = (over: Partial<CultureDetailDto> = {}) =>
  ({
    id: 'c_mid',
    strainName: 'Jar 4 ale',
    species: null,
    tags: ['house'],
    form: 'slurry_unwashed',
    origin: 'batch_slurry',
    state: 'stored',
    generation: 1,
    parentId: 'c_root',
    notes: 'Bottom crop',
    madeAt: '2026-11-01T00:00:00.000Z',
    ...over,
  }) as CultureDetailDto;

const summary = (id: string, strainName: string, generation = 0) =>
  ({ id, strainName, generation, form: 'slant', madeAt: '2026-10-01T00:00:00.000Z' }) as CultureSummaryDto;

const node = (id: string, parentId: string | null, strainName: string) =>
  ({ id, parentId, strainName, visible: true, openable: true }) as LineageNodeDto;

/** root → mid → kid, plus an unrelated culture "other". */
function serve(patch?: (body: unknown) => Response) {
  fetchMock.mockImplementation(async (input, init) => {
    const url = String(input);
    if (init?.method === 'PATCH') return patch ? patch(JSON.parse(String(init.body))) : jsonResponse(500, {});
    if (url.startsWith('/api/cultures/c_mid/lineage')) {
      return jsonResponse(200, {
        focusId: 'c_mid',
        rootId: 'c_root',
        nodes: [
          node('c_root', null, 'Founding jar'),
          node('c_mid', 'c_root', 'Jar 4 ale'),
          node('c_kid', 'c_mid', 'Kid slant'),
        ],
      });
    }
    if (url.startsWith('/api/cultures?')) {
      return jsonResponse(200, {
        cultures: [
          summary('c_root', 'Founding jar'),
          summary('c_mid', 'Jar 4 ale', 1),
          summary('c_kid', 'Kid slant', 1),
          summary('c_other', 'Other yeast', 3),
        ],
        page: 1,
        pageSize: 50,
        total: 4,
      });
    }
    return jsonResponse(404, { error: { code: 'not_found', message: 'Not found' } });
  });
}

function renderForm(c: CultureDetailDto) {
  const onDone = vi.fn();
  const view = renderPage(() => <EditDetails c={c} onDone={onDone} />, {
    path: '/cultures/:id',
    url: `/cultures/${c.id}`,
  });
  return { ...view, onDone };
}

const patches = () => fetchMock.mock.calls.filter(([, init]) => init?.method === 'PATCH');

describe('edit details', () => {
  it('sends only what changed, then closes and refreshes the culture', async () => {
    let sent: unknown;
    serve((body) => {
      sent = body;
      return jsonResponse(200, { culture: { ...culture(), ...(body as object) } });
    });
    const c = culture();
    const { onDone, queryClient } = renderForm(c);
    const u = userEvent.setup();
    const name = await screen.findByLabelText('Strain name');
    await u.clear(name);
    await u.type(name, 'Jar 4 farmhouse ale');
    const tags = screen.getByLabelText(/^Tags/);
    await u.clear(tags);
    await u.type(tags, 'house, Saison');
    await screen.findByRole('option', { name: /^Other yeast/ });
    await u.selectOptions(screen.getByLabelText('Grown from'), 'c_other');
    await u.click(screen.getByRole('button', { name: 'Save details' }));
    await waitFor(() => expect(onDone).toHaveBeenCalled());
    // tags are normalised by the shared schema before they leave
    expect(sent).toEqual({ strainName: 'Jar 4 farmhouse ale', tags: ['house', 'saison'], parentId: 'c_other' });
    expect(queryClient.getQueryData<CultureDetailDto>(cultureKeys.detail('c_mid'))?.strainName).toBe(
      'Jar 4 farmhouse ale',
    );
  });

  it('never offers the culture itself or anything grown from it as its parent', async () => {
    serve();
    renderForm(culture());
    const select = await screen.findByLabelText('Grown from');
    await waitFor(() => expect(within(select).getAllByRole('option').length).toBe(3));
    const labels = within(select)
      .getAllByRole('option')
      .map((o) => o.textContent);
    expect(labels[0]).toBe('No parent: it starts a lineage');
    expect(labels.some((l) => l?.startsWith('Founding jar'))).toBe(true);
    expect(labels.some((l) => l?.startsWith('Other yeast'))).toBe(true);
    expect(labels.some((l) => l?.startsWith('Jar 4 ale') || l?.startsWith('Kid slant'))).toBe(false);
  });

  it('refuses an empty name without calling the API', async () => {
    serve();
    const { onDone } = renderForm(culture());
    const u = userEvent.setup();
    await u.clear(await screen.findByLabelText('Strain name'));
    await u.click(screen.getByRole('button', { name: 'Save details' }));
    expect(await screen.findByText('Enter a strain name')).toBeTruthy();
    expect(screen.getByLabelText('Strain name').getAttribute('aria-invalid')).toBe('true');
    expect(patches()).toHaveLength(0);
    expect(onDone).not.toHaveBeenCalled();
  });

  it('shows the server’s parent message beside the parent field and stays open', async () => {
    serve(() =>
      jsonResponse(400, {
        error: {
          code: 'validation_failed',
          message: 'Invalid input',
          fields: { 'body.parentId': ['That culture descends from this one; a culture cannot be its own ancestor'] },
        },
      }),
    );
    const { onDone } = renderForm(culture());
    const u = userEvent.setup();
    await screen.findByRole('option', { name: /^Other yeast/ });
    await u.selectOptions(screen.getByLabelText('Grown from'), 'c_other');
    await u.click(screen.getByRole('button', { name: 'Save details' }));
    const message = await screen.findByText(/cannot be its own ancestor/);
    const select = screen.getByLabelText('Grown from');
    expect(select.getAttribute('aria-describedby')).toContain(message.closest('p')!.id);
    expect(onDone).not.toHaveBeenCalled();
  });

  it('has no parent field for bottle dregs, and no "no parent" choice for a re-culture', async () => {
    serve();
    const dregs = renderForm(culture({ id: 'c_d', origin: 'bottle_dregs', form: 'bottle_dregs', parentId: null }));
    await screen.findByLabelText('Strain name');
    expect(screen.queryByLabelText('Grown from')).toBeNull();
    expect(screen.getByText(/start a lineage of their own/)).toBeTruthy();
    dregs.unmount();

    renderForm(culture({ origin: 'reculture' }));
    const select = await screen.findByLabelText('Grown from');
    await waitFor(() => expect(within(select).getAllByRole('option').length).toBe(2));
    expect(within(select).queryByText('No parent: it starts a lineage')).toBeNull();
  });

  it('cancel closes without a request; saving nothing says so', async () => {
    serve();
    const { onDone } = renderForm(culture());
    const u = userEvent.setup();
    await u.click(await screen.findByRole('button', { name: 'Save details' }));
    expect(await screen.findByText('Nothing differs from what is saved.')).toBeTruthy();
    await u.click(screen.getByRole('button', { name: 'Cancel' }));
    expect(onDone).toHaveBeenCalledTimes(1);
    expect(patches()).toHaveLength(0);
  });
});
