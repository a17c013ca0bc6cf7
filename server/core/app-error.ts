/** An error a service throws on purpose: it carries the HTTP status and a stable code for clients. */
export class AppError extends Error {
  /** Set on 429 answers: how long until another attempt is let through. */
  retryAfterMinutes?: number;

  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
    this.name = 'AppError';
  }
}
