import type { HttpStatusCode } from './http-status';

/** The one error body shape of the API. */
export interface ApiErrorBody {
  error: {
    message: string;
    fields?: Record<string, string>;
  };
}

/** An error meant for the client: its message is a sentence a person can act on. */
export class HttpError extends Error {
  constructor(
    readonly status: HttpStatusCode,
    message: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
    this.name = 'HttpError';
  }

  toBody(): ApiErrorBody {
    return { error: this.fields ? { message: this.message, fields: this.fields } : { message: this.message } };
  }
}
