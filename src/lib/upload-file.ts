/**
 * Uploads one file as multipart form data with XMLHttpRequest, because fetch
 * cannot report upload progress. Uses the api client's CSRF token and turns
 * a failure into the same ApiError (the server's sentence when it sent one).
 */
import { api, ApiError, apiErrorFromAnswer, CSRF_HEADER_NAME, parseAnswerText, UNREACHABLE_SERVER_MESSAGE } from '@/lib/api-client';

/** The part of XMLHttpRequest this helper uses, so tests can hand in a fake. */
export interface UploadRequest {
  open(method: string, url: string): void;
  setRequestHeader(name: string, value: string): void;
  send(body: FormData): void;
  abort(): void;
  withCredentials: boolean;
  readonly status: number;
  readonly responseText: string;
  getResponseHeader(name: string): string | null;
  readonly upload: { onprogress: ((event: { loaded: number; total: number; lengthComputable: boolean }) => void) | null };
  onload: (() => void) | null;
  onerror: (() => void) | null;
  onabort: (() => void) | null;
}

export interface UploadFileOptions {
  url: string;
  /** Multipart field name the server reads the file from. */
  fieldName: string;
  file: Blob;
  fileName: string;
  /** Bytes sent so far and the request's total (multipart framing included). */
  onProgress?: (sentBytes: number, totalBytes: number) => void;
  signal?: AbortSignal;
  /** Defaults to `new XMLHttpRequest()`. */
  createRequest?: () => UploadRequest;
  /** Defaults to the shared api client's token. */
  csrfToken?: () => Promise<string | null>;
  nowMs?: () => number;
}

export function checkUploadFileOptions(options: UploadFileOptions): Required<Omit<UploadFileOptions, 'onProgress' | 'signal'>> &
  Pick<UploadFileOptions, 'onProgress' | 'signal'> {
  if (typeof options.url !== 'string' || !options.url.startsWith('/')) {
    throw new TypeError(`uploadFile: option "url" must be a same-site path starting with "/"; got ${JSON.stringify(options.url)}.`);
  }
  if (!options.fieldName) throw new TypeError('uploadFile: option "fieldName" must be a non-empty string.');
  if (!options.fileName) throw new TypeError('uploadFile: option "fileName" must be a non-empty string.');
  return {
    ...options,
    createRequest: options.createRequest ?? (() => new XMLHttpRequest() as unknown as UploadRequest),
    csrfToken: options.csrfToken ?? (() => api.csrfToken()),
    nowMs: options.nowMs ?? (() => Date.now()),
  };
}

/** Resolves with the parsed JSON answer; rejects with an ApiError, or a DOMException "AbortError" when cancelled. */
export async function uploadFile<T>(options: UploadFileOptions): Promise<T> {
  const { url, fieldName, file, fileName, onProgress, signal, createRequest, csrfToken, nowMs } = checkUploadFileOptions(options);
  if (signal?.aborted) throw new DOMException('The upload was cancelled.', 'AbortError');
  const token = await csrfToken();
  const form = new FormData();
  form.append(fieldName, file, fileName);

  return new Promise<T>((resolve, reject) => {
    const request = createRequest();
    const onAbortSignal = () => request.abort();
    const finish = () => signal?.removeEventListener('abort', onAbortSignal);
    request.open('POST', url);
    request.withCredentials = true;
    request.setRequestHeader('accept', 'application/json');
    if (token) request.setRequestHeader(CSRF_HEADER_NAME, token);
    request.upload.onprogress = (event) => {
      if (onProgress) onProgress(event.loaded, event.lengthComputable ? event.total : file.size);
    };
    request.onload = () => {
      finish();
      const body = parseAnswerText(request.status, request.responseText, request.getResponseHeader('content-type') ?? '');
      if (request.status >= 200 && request.status < 300) {
        resolve(body as T);
        return;
      }
      reject(apiErrorFromAnswer({ status: request.status, body, retryAfterHeader: request.getResponseHeader('retry-after'), nowMs: nowMs() }));
    };
    request.onerror = () => {
      finish();
      reject(new ApiError({ status: 0, message: UNREACHABLE_SERVER_MESSAGE }));
    };
    request.onabort = () => {
      finish();
      reject(new DOMException('The upload was cancelled.', 'AbortError'));
    };
    signal?.addEventListener('abort', onAbortSignal);
    request.send(form);
  });
}
