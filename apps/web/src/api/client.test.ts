import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ApiError, apiFetch, clientErrorCodes } from './client';

function jsonResponse(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), {
    status,
    headers: { 'Content-Type': 'application/json' },
  });
}

const fetchMock = vi.fn<typeof fetch>();

beforeEach(() => {
  fetchMock.mockReset();
  vi.stubGlobal('fetch', fetchMock);
});

afterEach(() => {
  vi.unstubAllGlobals();
});

async function rejectionOf(promise: Promise<unknown>): Promise<ApiError> {
  try {
    await promise;
  } catch (error) {
    expect(error).toBeInstanceOf(ApiError);
    return error as ApiError;
  }
  throw new Error('expected the request to fail');
}

describe('apiFetch', () => {
  it('sends JSON to /api on the same origin with cookies', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, { user: { id: 'u1' } }));

    const result = await apiFetch<{ user: { id: string } }>('/auth/sign-in', {
      method: 'POST',
      body: { email: 'a@example.test', password: 'x' },
    });

    expect(result).toEqual({ user: { id: 'u1' } });
    const [url, init] = fetchMock.mock.calls[0]!;
    expect(url).toBe('/api/auth/sign-in');
    expect(init?.method).toBe('POST');
    expect(init?.credentials).toBe('same-origin');
    expect(init?.body).toBe(JSON.stringify({ email: 'a@example.test', password: 'x' }));
    expect((init?.headers as Record<string, string>)['Content-Type']).toBe('application/json');
  });

  it('resolves undefined for 204 No Content', async () => {
    fetchMock.mockResolvedValue(new Response(null, { status: 204 }));
    await expect(apiFetch('/auth/sign-out', { method: 'POST' })).resolves.toBeUndefined();
  });

  it('maps a validation error body to status, code and field messages', async () => {
    fetchMock.mockResolvedValue(
      jsonResponse(400, {
        error: {
          code: 'validation_failed',
          message: 'Some fields need attention',
          requestId: 'req-7',
          fields: { password: ['Use at least 10 characters'], 'profile.name': ['Enter your name'] },
        },
      }),
    );

    const error = await rejectionOf(apiFetch('/auth/sign-up', { method: 'POST', body: {} }));
    expect(error.status).toBe(400);
    expect(error.code).toBe('validation_failed');
    expect(error.message).toBe('Some fields need attention');
    expect(error.requestId).toBe('req-7');
    expect(error.fields).toEqual({
      password: ['Use at least 10 characters'],
      'profile.name': ['Enter your name'],
    });
    expect(error.hasFieldErrors).toBe(true);
  });

  it('keeps the server code and message for a conflict', async () => {
    fetchMock.mockResolvedValue(
      jsonResponse(409, { error: { code: 'email_taken', message: 'This e-mail already has an account' } }),
    );
    const error = await rejectionOf(apiFetch('/auth/sign-up', { method: 'POST', body: {} }));
    expect(error.status).toBe(409);
    expect(error.code).toBe('email_taken');
    expect(error.message).toBe('This e-mail already has an account');
    expect(error.fields).toEqual({});
    expect(error.hasFieldErrors).toBe(false);
  });

  it('falls back to a code from the status when the body is not an error body', async () => {
    fetchMock.mockResolvedValue(new Response('<html>Too Many Requests</html>', { status: 429 }));
    const error = await rejectionOf(apiFetch('/auth/sign-in', { method: 'POST', body: {} }));
    expect(error.status).toBe(429);
    expect(error.code).toBe('rate_limited');
    expect(error.message).toMatch(/too many tries/i);
  });

  it('treats a 500 without a body as a generic server failure', async () => {
    fetchMock.mockResolvedValue(new Response('', { status: 500 }));
    const error = await rejectionOf(apiFetch('/auth/me'));
    expect(error.status).toBe(500);
    expect(error.code).toBe(clientErrorCodes.badResponse);
    expect(error.message).toMatch(/our side/);
  });

  it('turns a network failure into status 0 with a network_error code', async () => {
    fetchMock.mockRejectedValue(new TypeError('Failed to fetch'));
    const error = await rejectionOf(apiFetch('/auth/me'));
    expect(error.status).toBe(0);
    expect(error.code).toBe(clientErrorCodes.network);
  });

  it('rejects a 200 whose body is not JSON', async () => {
    fetchMock.mockResolvedValue(new Response('<!doctype html>', { status: 200 }));
    const error = await rejectionOf(apiFetch('/auth/me'));
    expect(error.code).toBe(clientErrorCodes.badResponse);
  });
});
