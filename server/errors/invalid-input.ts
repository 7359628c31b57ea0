import { AppError } from './app-error';

/**
 * 400 for input that passed its schema but fails a check that needs stored data (values that
 * do not fit the table's axes, a vehicle whose merged engine is incomplete). It has the same
 * shape as the `validate` middleware's answer, so a client reads both the same way.
 */
export function invalidInput(path: string, message: string): AppError {
  return new AppError(400, 'invalid_input', `Invalid ${path}: ${message}`, {
    issues: [{ path, message }],
  });
}
