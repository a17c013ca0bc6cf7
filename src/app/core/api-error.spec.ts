import { HttpErrorResponse } from '@angular/common/http';
import { apiError } from './api-error';

describe('apiError', () => {
  it('should take the code, message, fields and wait from the server', () => {
    const error = new HttpErrorResponse({
      status: 429,
      error: {
        error: {
          code: 'rate_limited',
          message: 'Too many sign-in attempts.',
          fields: { email: 'Slow down' },
          retryAfterMinutes: 15,
        },
      },
    });

    expect(apiError(error)).toEqual({
      code: 'rate_limited',
      message: 'Too many sign-in attempts.',
      fields: { email: 'Slow down' },
      retryAfterMinutes: 15,
    });
  });

  it('should fill in no fields and no wait when the server sends none', () => {
    const error = new HttpErrorResponse({
      status: 401,
      error: { error: { code: 'invalid_credentials', message: 'That e-mail and password do not match.' } },
    });

    expect(apiError(error)).toEqual({
      code: 'invalid_credentials',
      message: 'That e-mail and password do not match.',
      fields: {},
      retryAfterMinutes: null,
    });
  });

  it('should say there is no connection when the request never reached the server', () => {
    const problem = apiError(new HttpErrorResponse({ status: 0, error: new ProgressEvent('error') }));

    expect(problem.code).toBe('offline');
    expect(problem.message).toBe('No connection, so nothing was sent. Try again when you are online.');
  });

  it('should not show a page of HTML from a proxy in trouble', () => {
    const problem = apiError(new HttpErrorResponse({ status: 502, error: '<html>Bad gateway</html>' }));

    expect(problem.code).toBe('unexpected');
    expect(problem.message).toBe('Something went wrong on our side. Try again in a moment.');
  });
});
