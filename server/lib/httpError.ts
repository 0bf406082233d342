/** The one error a service throws; the error middleware turns it into `{ error: { code, message, details? } }`. */
export class HttpError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly details?: unknown,
  ) {
    super(message)
    this.name = 'HttpError'
  }
}

export const notFound = (what: string) => new HttpError(404, 'not_found', `${what} was not found`)
export const conflict = (code: string, message: string, details?: unknown) =>
  new HttpError(409, code, message, details)
export const badRequest = (code: string, message: string, details?: unknown) =>
  new HttpError(400, code, message, details)
export const forbidden = (message = 'Your role may not do this') =>
  new HttpError(403, 'forbidden', message)
