/** An error with an HTTP status and a stable code the client can rely on. */
export class AppError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly fields?: Record<string, string[]>,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export const badRequest = (message: string, code = 'bad_request', fields?: Record<string, string[]>) =>
  new AppError(400, code, message, fields);
export const validationFailed = (fields: Record<string, string[]>) =>
  new AppError(400, 'validation_failed', 'Some fields need attention', fields);
export const unauthenticated = (message = 'Sign in to continue') => new AppError(401, 'unauthenticated', message);
export const invalidCredentials = () => new AppError(401, 'invalid_credentials', 'E-mail or password is wrong');
export const forbidden = (message = 'You do not have access to this') => new AppError(403, 'forbidden', message);
export const notFound = (what = 'This item') => new AppError(404, 'not_found', `${what} was not found`);
export const conflict = (code: string, message: string, fields?: Record<string, string[]>) =>
  new AppError(409, code, message, fields);
export const serviceUnavailable = () =>
  new AppError(503, 'service_unavailable', 'The service is briefly unavailable; try again in a moment');
