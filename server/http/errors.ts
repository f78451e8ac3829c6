/** Typed errors carry their HTTP status; one middleware turns them into the API's error shape. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
  }
}

export class ValidationError extends AppError {
  constructor(fields: Record<string, string>, message = 'Some fields need attention') {
    super(400, 'invalid', message, fields);
  }
}

export class UnauthorisedError extends AppError {
  constructor(message = 'Sign in first') {
    super(401, 'unauthorised', message);
  }
}

export class ForbiddenError extends AppError {
  constructor(message: string) {
    super(403, 'forbidden', message);
  }
}

/** Also used for rows of another organisation: their existence is not disclosed. */
export class NotFoundError extends AppError {
  constructor(what: string) {
    super(404, 'not_found', `${what} not found`);
  }
}
