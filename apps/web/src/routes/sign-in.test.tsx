import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { jsonResponse, renderPage } from '../test/render';
import { Component as SignIn } from './sign-in';

const fetchMock = vi.fn<typeof fetch>();

beforeEach(() => {
  fetchMock.mockReset();
  vi.stubGlobal('fetch', fetchMock);
});
afterEach(() => {
  vi.unstubAllGlobals();
});

async function signInWith(email: string, password: string) {
  const u = userEvent.setup();
  await u.type(screen.getByLabelText('E-mail'), email);
  await u.type(screen.getByLabelText('Password'), password);
  await u.click(screen.getByRole('button', { name: 'Sign in' }));
}

describe('sign-in page', () => {
  it('shows wrong credentials in the form alert and stays on the page', async () => {
    fetchMock.mockResolvedValueOnce(
      jsonResponse(401, { error: { code: 'invalid_credentials', message: 'E-mail or password is wrong' } }),
    );
    const { router } = renderPage(SignIn, { path: '/sign-in' });
    await signInWith('pat@example.test', 'not the password');

    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('E-mail or password is wrong');
    expect(router.state.location.pathname).toBe('/sign-in');
  });

  it('returns to the page named in ?next= after signing in', async () => {
    fetchMock.mockResolvedValueOnce(jsonResponse(200, { user: { id: 'u_1', name: 'Pat Example' } }));
    renderPage(SignIn, { path: '/sign-in', url: '/sign-in?next=%2Faccount', otherPaths: ['/account', '/'] });
    await signInWith('pat@example.test', 'the right password');
    expect(await screen.findByText('Arrived at /account')).toBeTruthy();
  });

  it('ignores a ?next= that points at another site', async () => {
    fetchMock.mockResolvedValueOnce(jsonResponse(200, { user: { id: 'u_1', name: 'Pat Example' } }));
    renderPage(SignIn, { path: '/sign-in', url: '/sign-in?next=%2F%2Fevil.example', otherPaths: ['/'] });
    await signInWith('pat@example.test', 'the right password');
    expect(await screen.findByText('Arrived at /')).toBeTruthy();
  });
});
