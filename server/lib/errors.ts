// Typed errors with an HTTP status and a stable code; one handler turns them into
// `{ error: { code, message } }` so the client can show a real message.
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export class ValidationError extends AppError {
  constructor(message: string, details?: Record<string, unknown>) {
    super(400, 'validation_failed', message, details);
  }
}

export class UnauthenticatedError extends AppError {
  constructor(message = 'Please sign in to do this.') {
    super(401, 'unauthenticated', message);
  }
}

export class ForbiddenError extends AppError {
  constructor(message = 'You are not allowed to do this.') {
    super(403, 'forbidden', message);
  }
}

export class NotFoundError extends AppError {
  constructor(message = 'Not found.') {
    super(404, 'not_found', message);
  }
}

export class ConflictError extends AppError {
  constructor(message: string, details?: Record<string, unknown>) {
    super(409, 'conflict', message, details);
  }
}

export class PayloadTooLargeError extends AppError {
  constructor(message: string) {
    super(413, 'payload_too_large', message);
  }
}

export class TooManyRequestsError extends AppError {
  constructor(message: string) {
    super(429, 'too_many_requests', message);
  }
}
