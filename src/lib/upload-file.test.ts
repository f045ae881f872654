import { describe, expect, it } from 'vitest';
import { ApiError, CSRF_HEADER_NAME } from '@/lib/api-client';
import { uploadFile, type UploadRequest } from '@/lib/upload-file';

/** A stand-in for XMLHttpRequest that records what was sent and answers when told. */
class FakeRequest implements UploadRequest {
  method = '';
  url = '';
  headers: Record<string, string> = {};
  body: FormData | null = null;
  aborted = false;
  withCredentials = false;
  status = 0;
  responseText = '';
  responseHeaders: Record<string, string> = {};
  upload: UploadRequest['upload'] = { onprogress: null };
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  onabort: (() => void) | null = null;
  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }
  setRequestHeader(name: string, value: string) {
    this.headers[name] = value;
  }
  send(body: FormData) {
    this.body = body;
  }
  abort() {
    this.aborted = true;
    this.onabort?.();
  }
  getResponseHeader(name: string) {
    return this.responseHeaders[name.toLowerCase()] ?? null;
  }
  answer(status: number, body: unknown, headers: Record<string, string> = { 'content-type': 'application/json; charset=utf-8' }) {
    this.status = status;
    this.responseText = typeof body === 'string' ? body : JSON.stringify(body);
    this.responseHeaders = headers;
    this.onload?.();
  }
}

function setUp() {
  const requests: FakeRequest[] = [];
  const progress: [number, number][] = [];
  const file = new Blob([new Uint8Array(2048)], { type: 'image/png' });
  const start = (signal?: AbortSignal) =>
    uploadFile<{ frame: { id: string } }>({
      url: '/api/sweeps/s1/frames',
      fieldName: 'frame',
      file,
      fileName: 'frame_0001.png',
      onProgress: (sent, total) => progress.push([sent, total]),
      signal,
      createRequest: () => {
        const request = new FakeRequest();
        requests.push(request);
        return request;
      },
      csrfToken: async () => 'tok-7',
    });
  const sent = async () => {
    for (let i = 0; i < 5 && requests.length === 0; i += 1) await Promise.resolve();
    return requests[0];
  };
  return { start, sent, progress };
}

describe('uploadFile', () => {
  it('uploadFile posts one file in the named multipart field with the CSRF header and reports progress', async () => {
    const { start, sent, progress } = setUp();
    const done = start();
    const request = await sent();
    expect([request.method, request.url, request.withCredentials]).toEqual(['POST', '/api/sweeps/s1/frames', true]);
    expect(request.headers[CSRF_HEADER_NAME]).toBe('tok-7');
    const part = request.body!.get('frame') as File;
    expect(part.name).toBe('frame_0001.png');
    expect(part.size).toBe(2048);
    request.upload.onprogress!({ loaded: 1024, total: 2300, lengthComputable: true });
    request.upload.onprogress!({ loaded: 700, total: 0, lengthComputable: false });
    request.answer(201, { frame: { id: 'f1' } });
    await expect(done).resolves.toEqual({ frame: { id: 'f1' } });
    expect(progress).toEqual([
      [1024, 2300],
      [700, 2048],
    ]);
  });

  it('uploadFile rejects with the server’s own sentence and fields, as the api client does', async () => {
    const { start, sent } = setUp();
    const done = start();
    const request = await sent();
    request.answer(400, { error: { message: 'frame_0001.png is truncated: the PNG ends before its image data.', fields: { frame: 'truncated' } } });
    const error = (await done.catch((e: unknown) => e)) as ApiError;
    expect(error).toBeInstanceOf(ApiError);
    expect(error.status).toBe(400);
    expect(error.message).toBe('frame_0001.png is truncated: the PNG ends before its image data.');
    expect(error.fields).toEqual({ frame: 'truncated' });
  });

  it('uploadFile explains a 413 without a JSON body, and a dropped connection as status 0', async () => {
    const first = setUp();
    const tooLarge = first.start();
    (await first.sent()).answer(413, '<html>too large</html>', { 'content-type': 'text/html' });
    await expect(tooLarge).rejects.toMatchObject({ status: 413, message: 'The upload is larger than the server accepts.' });

    const second = setUp();
    const dropped = second.start();
    (await second.sent()).onerror!();
    await expect(dropped).rejects.toMatchObject({ status: 0 });
  });

  it('uploadFile aborts the request when its signal is aborted', async () => {
    const { start, sent } = setUp();
    const controller = new AbortController();
    const done = start(controller.signal);
    const request = await sent();
    controller.abort();
    expect(request.aborted).toBe(true);
    await expect(done).rejects.toMatchObject({ name: 'AbortError' });
  });
});
