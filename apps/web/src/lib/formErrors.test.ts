import { describe, expect, it, vi } from 'vitest';
import { ApiError } from '../api/client';
import { applyApiError, FORM_ERROR, safeNextPath } from './formErrors';

type Values = { email: string; password: string };

describe('applyApiError', () => {
  it('puts field messages on known inputs and nothing in the form alert', () => {
    const setError = vi.fn();
    const error = new ApiError({
      status: 400,
      code: 'validation_failed',
      message: 'Check the highlighted fields',
      fields: { 'body.password': ['Use at least 10 characters', 'At most 200 characters'] },
    });
    const placed = applyApiError<Values>(error, setError, ['email', 'password']);
    expect(placed).toBe(true);
    expect(setError).toHaveBeenCalledTimes(1);
    expect(setError).toHaveBeenCalledWith(
      'password',
      { type: 'server', message: 'Use at least 10 characters At most 200 characters' },
      { shouldFocus: true },
    );
  });

  it('accepts field paths without the body. prefix too', () => {
    const setError = vi.fn();
    const error = new ApiError({
      status: 400,
      code: 'validation_failed',
      message: 'Check the highlighted fields',
      fields: { email: ['Enter a valid e-mail address'] },
    });
    applyApiError<Values>(error, setError, ['email', 'password']);
    expect(setError).toHaveBeenCalledWith(
      'email',
      { type: 'server', message: 'Enter a valid e-mail address' },
      { shouldFocus: true },
    );
  });

  it('puts errors without fields in the form alert, with an optional friendlier message', () => {
    const setError = vi.fn();
    const error = new ApiError({ status: 429, code: 'rate_limited', message: 'Too many requests' });
    applyApiError<Values>(error, setError, ['email', 'password'], { rate_limited: 'Slow down a little.' });
    expect(setError).toHaveBeenCalledWith(FORM_ERROR, { type: 'rate_limited', message: 'Slow down a little.' });
  });

  it('sends messages for fields the form does not have to the form alert', () => {
    const setError = vi.fn();
    const error = new ApiError({
      status: 400,
      code: 'validation_failed',
      message: 'Invalid input',
      fields: { 'body.token': ['This reset link is not valid'] },
    });
    applyApiError<Values>(error, setError, ['email', 'password']);
    expect(setError).toHaveBeenCalledWith(FORM_ERROR, {
      type: 'validation_failed',
      message: 'This reset link is not valid',
    });
  });
});

describe('safeNextPath', () => {
  it('keeps same-site paths and drops anything that could leave the site', () => {
    expect(safeNextPath('/account?tab=units')).toBe('/account?tab=units');
    expect(safeNextPath('//evil.example')).toBeNull();
    expect(safeNextPath('/\\evil.example')).toBeNull();
    expect(safeNextPath('https://evil.example')).toBeNull();
    expect(safeNextPath(null)).toBeNull();
  });
});
