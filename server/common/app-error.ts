// The one error type services throw; the error middleware turns it into the API's JSON error shape.
export class AppError extends Error {
  constructor(
    readonly code: string,
    message: string,
    readonly status: number,
    readonly fields?: Record<string, string>,
    readonly headers?: Record<string, string>,
  ) {
    super(message);
  }
}

export const notFound = (what: string) => new AppError('not_found', `${what} was not found.`, 404);
export const badRequest = (message: string, fields?: Record<string, string>) => new AppError('invalid_input', message, 400, fields);
export const conflict = (message: string) => new AppError('conflict', message, 409);
