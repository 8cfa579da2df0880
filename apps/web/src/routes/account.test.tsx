import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { UserDto } from '@barmkeep/schemas';
import { authKeys } from '../api/auth/queries';
import { jsonResponse, renderPage } from '../test/render';
import { Component as Account } from './account';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  fetchMock.mockReset();
  vi.stubGlobal('fetch', fetchMock);
});
afterEach(() => {
  vi.unstubAllGlobals();
});

const user: UserDto = {
  id: 'u_1',
  email: 'pat@example.test',
  name: 'Pat Example',
  role: 'user',
  unitSystem: 'metric',
  temperatureUnit: 'C',
  gravityUnit: 'sg',
  timeZone: 'UTC',
  createdAt: '2025-03-04T10:00:00.000Z',
};

function renderAccount() {
  const view = renderPage(Account, { path: '/account' });
  view.queryClient.setQueryData(authKeys.me(), user);
  return view;
}

describe('account page', () => {
  it('saves units and time zone and says so', async () => {
    fetchMock.mockImplementation(async (input, init) => {
      if (String(input) === '/api/account' && init?.method === 'PATCH') {
        return jsonResponse(200, { user: { ...user, ...JSON.parse(String(init.body)) } });
      }
      return jsonResponse(200, { user });
    });
    renderAccount();
    const u = userEvent.setup();

    await u.click(await screen.findByLabelText(/Fahrenheit/));
    await u.click(screen.getByLabelText(/Degrees Plato/));
    await u.selectOptions(screen.getByLabelText('Time zone'), 'Europe/Berlin');
    expect(screen.getByText('You have unsaved changes.')).toBeTruthy();
    await u.click(screen.getByRole('button', { name: 'Save changes' }));

    expect(await screen.findByText('Your settings are updated.')).toBeTruthy();
    const patch = fetchMock.mock.calls.find(([, init]) => init?.method === 'PATCH');
    expect(JSON.parse(String(patch?.[1]?.body))).toEqual({
      name: 'Pat Example',
      unitSystem: 'metric',
      temperatureUnit: 'F',
      gravityUnit: 'plato',
      timeZone: 'Europe/Berlin',
    });
  });

  it('refuses an empty name without calling the API', async () => {
    renderAccount();
    const u = userEvent.setup();
    await u.clear(await screen.findByLabelText('Name'));
    await u.click(screen.getByRole('button', { name: 'Save changes' }));
    expect(await screen.findByText('Enter your name')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalledWith('/api/account', expect.anything());
  });

  it('shows a server message for the time zone next to its select', async () => {
    fetchMock.mockImplementation(async (_input, init) =>
      init?.method === 'PATCH'
        ? jsonResponse(400, {
            error: {
              code: 'validation_failed',
              message: 'Invalid input',
              fields: { 'body.timeZone': ['Unknown time zone'] },
            },
          })
        : jsonResponse(200, { user }),
    );
    renderAccount();
    const u = userEvent.setup();
    await u.click(await screen.findByRole('button', { name: 'Save changes' }));
    const message = await screen.findByText('Unknown time zone');
    await waitFor(() =>
      expect(screen.getByLabelText('Time zone').getAttribute('aria-describedby')).toContain(message.closest('p')!.id),
    );
    expect(screen.queryByText('Your settings are updated.')).toBeNull();
  });
});
