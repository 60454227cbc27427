import { ApiError } from './client';

/** A short reference the lab's administrator can find in the server log. */
const reference = (error: ApiError) =>
  error.requestId ? ` If it keeps happening, quote reference ${error.requestId.slice(0, 8)}.` : '';

/** The banner text for a failed request, chosen by the error's code (never by its message). */
export function bannerMessage(error: unknown): string {
  if (!(error instanceof ApiError)) return 'Something went wrong. Please try again.';
  switch (error.code) {
    case 'network':
      return 'Cannot reach the Quenchbook server. Check the connection and try again.';
    case 'invalid_request':
      return 'Please check the fields marked below.';
    case 'invalid_credentials':
      return 'That e-mail address and password do not match an account.';
    case 'csrf_failed':
      return 'Your page is out of date. Reload it and try again.';
    case 'unauthenticated':
    case 'token_expired':
      return 'Your sign-in has ended. Please sign in again.';
    case 'forbidden':
      return 'Your role in this lab does not allow this.';
    case 'internal':
    case 'unexpected_response':
      return `Something went wrong on our side. Please try again in a moment.${reference(error)}`;
    default:
      // rate_limited (with its wait time), last_manager, invalid_link, email_taken, …:
      // the server's sentence is written for people.
      return error.message;
  }
}
