import { HttpErrorResponse } from '@angular/common/http';
import type { ApiErrorBody } from '@benchtide/shared';

/** What the server, or the way to it, said when a request did not go through. */
export interface ApiProblem {
  readonly code: string;
  /** Plain words for the modeller, written by the server. */
  readonly message: string;
  /** Messages for single fields, by the request's field name. */
  readonly fields: Readonly<Record<string, string>>;
  readonly retryAfterMinutes: number | null;
}

export const OFFLINE_PROBLEM: ApiProblem = {
  code: 'offline',
  message: 'No connection, so nothing was sent. Try again when you are online.',
  fields: {},
  retryAfterMinutes: null,
};

const UNEXPECTED_PROBLEM: ApiProblem = {
  code: 'unexpected',
  message: 'Something went wrong on our side. Try again in a moment.',
  fields: {},
  retryAfterMinutes: null,
};

/** Turns a failed request into what the screen shows: the server's own words where it sent any. */
export function apiError(error: HttpErrorResponse): ApiProblem {
  // Status 0: the request never reached the server (offline, or the connection dropped).
  if (error.status === 0) return OFFLINE_PROBLEM;
  const body = errorBody(error.error);
  if (body === null) return UNEXPECTED_PROBLEM;
  return {
    code: body.code,
    message: body.message,
    fields: body.fields ?? {},
    retryAfterMinutes: body.retryAfterMinutes ?? null,
  };
}

function errorBody(body: unknown): ApiErrorBody['error'] | null {
  if (typeof body !== 'object' || body === null || !('error' in body)) return null;
  const { error } = body as Partial<ApiErrorBody>;
  return typeof error?.code === 'string' && typeof error.message === 'string' ? error : null;
}
