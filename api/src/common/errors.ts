/** Domain errors carry a code; the exception filter maps each code to one HTTP status. */
export const ErrorCode = {
  NotFound: 'not_found',
  Conflict: 'conflict',
  Invalid: 'invalid',
  Forbidden: 'forbidden',
  Unauthenticated: 'unauthenticated',
  Immutable: 'immutable',
} as const;
export type ErrorCode = (typeof ErrorCode)[keyof typeof ErrorCode];

export class DomainError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly details?: { path: string; message: string }[] | Record<string, unknown>,
  ) {
    super(message);
    this.name = 'DomainError';
  }
}

export const notFound = (what = 'record'): DomainError =>
  new DomainError(ErrorCode.NotFound, `No such ${what}.`);
export const conflict = (message: string, details?: DomainError['details']): DomainError =>
  new DomainError(ErrorCode.Conflict, message, details);
export const invalid = (message: string, details?: DomainError['details']): DomainError =>
  new DomainError(ErrorCode.Invalid, message, details);
export const forbidden = (message = 'You do not have access to this.'): DomainError =>
  new DomainError(ErrorCode.Forbidden, message);
export const unauthenticated = (message = 'Please sign in.'): DomainError =>
  new DomainError(ErrorCode.Unauthenticated, message);
