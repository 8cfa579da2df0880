import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { jsonResponse, renderPage } from '../test/render';
import { Component as SignUp } from './sign-up';

const fetchMock = vi.fn<typeof fetch>();

beforeEach(() => {
  fetchMock.mockReset();
  vi.stubGlobal('fetch', fetchMock);
});
afterEach(() => {
  vi.unstubAllGlobals();
});

const user = {
  id: 'u_1',
  email: 'pat@example.test',
  name: 'Pat Example',
  role: 'user',
  unitSystem: 'metric',
  temperatureUnit: 'C',
  gravityUnit: 'sg',
  timeZone: 'UTC',
  createdAt: '2025-01-01T00:00:00.000Z',
};

async function fillIn(values: { name: string; email: string; password: string }) {
  const u = userEvent.setup();
  await u.type(screen.getByLabelText('Your name'), values.name);
  await u.type(screen.getByLabelText('E-mail'), values.email);
  await u.type(screen.getByLabelText('Password'), values.password);
  await u.click(screen.getByRole('button', { name: 'Create account' }));
}

describe('sign-up page', () => {
  it('shows the minimum-length message next to the password and sends nothing', async () => {
    renderPage(SignUp, { path: '/sign-up' });
    await fillIn({ name: 'Pat Example', email: 'pat@example.test', password: 'short' });

    const message = await screen.findByText('Use at least 10 characters');
    const password = screen.getByLabelText('Password');
    expect(password.getAttribute('aria-invalid')).toBe('true');
    expect(password.getAttribute('aria-describedby')).toContain(message.closest('p')!.id);
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('shows an invalid e-mail next to its input', async () => {
    renderPage(SignUp, { path: '/sign-up' });
    await fillIn({ name: 'Pat Example', email: 'not-an-address', password: 'long enough password' });
    expect(await screen.findByText('Enter a valid e-mail address')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('puts server field errors next to their inputs', async () => {
    fetchMock.mockResolvedValueOnce(
      jsonResponse(400, {
        error: {
          code: 'validation_failed',
          message: 'Check the highlighted fields',
          fields: { 'body.name': ['This name is not allowed'] },
        },
      }),
    );
    renderPage(SignUp, { path: '/sign-up' });
    await fillIn({ name: 'Pat Example', email: 'pat@example.test', password: 'long enough password' });

    const message = await screen.findByText('This name is not allowed');
    expect(screen.getByLabelText('Your name').getAttribute('aria-describedby')).toContain(message.closest('p')!.id);
    expect(screen.queryByRole('alert')).toBeNull();
  });

  it('explains a taken e-mail in the form alert', async () => {
    fetchMock.mockResolvedValueOnce(
      jsonResponse(409, { error: { code: 'email_taken', message: 'E-mail already registered' } }),
    );
    renderPage(SignUp, { path: '/sign-up' });
    await fillIn({ name: 'Pat Example', email: 'pat@example.test', password: 'long enough password' });

    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('An account with this e-mail already exists');
    expect(fetchMock).toHaveBeenCalledTimes(1);
  });

  it('sends the trimmed, lower-cased values and goes home once signed in', async () => {
    fetchMock.mockImplementation(async (input) => {
      const url = String(input);
      if (url === '/api/auth/sign-up') return jsonResponse(201, { user });
      if (url === '/api/auth/me') return jsonResponse(200, { user });
      return jsonResponse(404, { error: { code: 'not_found', message: 'Not found' } });
    });
    renderPage(SignUp, { path: '/sign-up', otherPaths: ['/'] });
    await fillIn({ name: '  Pat Example ', email: 'Pat@Example.test', password: 'long enough password' });

    expect(await screen.findByText('Arrived at /')).toBeTruthy();
    const signUpCall = fetchMock.mock.calls.find(([input]) => String(input) === '/api/auth/sign-up');
    expect(JSON.parse(String(signUpCall?.[1]?.body))).toEqual({
      name: 'Pat Example',
      email: 'pat@example.test',
      password: 'long enough password',
    });
    await waitFor(() => expect(fetchMock).toHaveBeenCalledWith('/api/auth/me', expect.anything()));
  });
});
