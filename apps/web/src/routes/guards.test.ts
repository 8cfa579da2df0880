import { QueryClient } from '@tanstack/react-query';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { jsonResponse } from '../test/render';
import { guestOnlyLoader, requireUserLoader } from './guards';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  fetchMock.mockReset();
  vi.stubGlobal('fetch', fetchMock);
});
afterEach(() => {
  vi.unstubAllGlobals();
});

const signedOut = () =>
  fetchMock.mockResolvedValue(jsonResponse(401, { error: { code: 'unauthenticated', message: 'Sign in first' } }));
const signedIn = () => fetchMock.mockResolvedValue(jsonResponse(200, { user: { id: 'u_1', name: 'Pat Example' } }));

function loaderArgs(url: string) {
  return { request: new Request(url), params: {}, context: undefined, unstable_pattern: '' } as never;
}

async function thrownBy(run: () => Promise<unknown>): Promise<Response> {
  try {
    await run();
  } catch (thrown) {
    expect(thrown).toBeInstanceOf(Response);
    return thrown as Response;
  }
  throw new Error('expected a redirect');
}

describe('requireUserLoader', () => {
  it('sends signed-out people to sign-in with the page they wanted', async () => {
    signedOut();
    const loader = requireUserLoader(new QueryClient());
    const response = await thrownBy(() => loader(loaderArgs('http://app.test/account?tab=units')));
    expect(response.status).toBe(302);
    expect(response.headers.get('Location')).toBe('/sign-in?next=%2Faccount%3Ftab%3Dunits');
  });

  it('lets signed-in people through', async () => {
    signedIn();
    const loader = requireUserLoader(new QueryClient());
    await expect(loader(loaderArgs('http://app.test/account'))).resolves.toBeNull();
  });

  it('does not treat a server failure as signed out', async () => {
    fetchMock.mockResolvedValue(jsonResponse(500, { error: { code: 'internal', message: 'Boom' } }));
    const loader = requireUserLoader(new QueryClient({ defaultOptions: { queries: { retry: false } } }));
    await expect(loader(loaderArgs('http://app.test/'))).rejects.toMatchObject({ status: 500, code: 'internal' });
  });
});

describe('guestOnlyLoader', () => {
  it('sends signed-in people home, or to a safe ?next= path', async () => {
    signedIn();
    const loader = guestOnlyLoader(new QueryClient());
    const home = await thrownBy(() => loader(loaderArgs('http://app.test/sign-in')));
    expect(home.headers.get('Location')).toBe('/');
    const next = await thrownBy(() => loader(loaderArgs('http://app.test/sign-in?next=%2Faccount')));
    expect(next.headers.get('Location')).toBe('/account');
    const offsite = await thrownBy(() => loader(loaderArgs('http://app.test/sign-in?next=%2F%2Fevil.example')));
    expect(offsite.headers.get('Location')).toBe('/');
  });

  it('shows the page to signed-out people', async () => {
    signedOut();
    const loader = guestOnlyLoader(new QueryClient());
    await expect(loader(loaderArgs('http://app.test/sign-in'))).resolves.toBeNull();
  });
});
