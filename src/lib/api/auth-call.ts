/** Calls a better-auth server API and turns its errors into our ApiError shape. */
import { isAPIError } from 'better-auth/api';
import { ApiError } from './errors';

export async function authCall<T>(fn: () => Promise<T>): Promise<T> {
  try {
    return await fn();
  } catch (err) {
    if (isAPIError(err)) {
      const status = typeof err.statusCode === 'number' && err.statusCode >= 400 && err.statusCode < 500 ? err.statusCode : 400;
      const body = (err.body ?? {}) as { message?: string; code?: string };
      throw new ApiError(status, (body.code ?? 'auth_error').toLowerCase(), body.message ?? err.message);
    }
    throw err;
  }
}
