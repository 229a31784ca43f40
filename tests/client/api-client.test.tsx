import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ApiError, api, setCsrfToken } from '@/lib/api-client';

function json(status: number, body: unknown, headers: Record<string, string> = {}): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json', ...headers } });
}

describe('api client', () => {
  const fetchMock = vi.fn<typeof fetch>();

  beforeEach(() => {
    vi.useFakeTimers();
    fetchMock.mockReset();
    vi.stubGlobal('fetch', fetchMock);
    setCsrfToken('token-1');
  });
  afterEach(() => {
    vi.useRealTimers();
    vi.unstubAllGlobals();
  });

  it('sends a write again once, after Retry-After, when the server says the database was busy (nothing saved)', async () => {
    fetchMock
      .mockResolvedValueOnce(json(503, { error: { code: 'database_busy', message: 'Busy.' } }, { 'Retry-After': '2' }))
      .mockResolvedValueOnce(json(200, { data: { id: 'c1' } }));
    const result = api.patch('/api/clients/c1', { notes: 'x' });
    await vi.advanceTimersByTimeAsync(1_999);
    expect(fetchMock).toHaveBeenCalledTimes(1);
    await vi.advanceTimersByTimeAsync(1);
    await expect(result).resolves.toEqual({ data: { id: 'c1' } });
    expect(fetchMock).toHaveBeenCalledTimes(2);
    const [, second] = fetchMock.mock.calls[1]!;
    expect(second?.method).toBe('PATCH');
    expect(second?.body).toBe(JSON.stringify({ notes: 'x' }));
  });

  it('gives up after one retry and shows the busy message', async () => {
    fetchMock.mockImplementation(() => Promise.resolve(json(503, { error: { code: 'database_busy', message: 'Try again in a moment.' } }, { 'Retry-After': '1' })));
    const result = api.post('/api/clients', { name: 'A' });
    const caught = result.catch((e: unknown) => e);
    await vi.advanceTimersByTimeAsync(1_000);
    const error = await caught;
    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).code).toBe('database_busy');
    expect(fetchMock).toHaveBeenCalledTimes(2);
  });

  it('puts the server’s reference into the message of a failure on its side', async () => {
    fetchMock.mockResolvedValueOnce(json(500, { error: { code: 'internal', message: 'Something went wrong on our side.', requestId: 'req-42' } }));
    const error = (await api.get('/api/clients').catch((e: unknown) => e)) as ApiError;
    expect(error.requestId).toBe('req-42');
    expect(error.message).toBe('Something went wrong on our side. (Reference req-42.)');
  });

  it('a validation answer keeps its message and fields as they are', async () => {
    fetchMock.mockResolvedValueOnce(json(400, { error: { code: 'validation_failed', message: 'Check the name.', fields: { name: 'Required.' } } }));
    const error = (await api.post('/api/clients', {}).catch((e: unknown) => e)) as ApiError;
    expect(error.message).toBe('Check the name.');
    expect(error.fields).toEqual({ name: 'Required.' });
    expect(error.requestId).toBeUndefined();
  });
});
