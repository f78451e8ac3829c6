/** The client reads every API answer through the shared zod schemas (lib/api.ts). */
import assert from 'node:assert/strict';
import { afterEach, describe, it } from 'node:test';
import { ApiError, api, describeError } from '../../lib/api';
import { meResponse } from '../../shared/schemas';
import { pushResponse } from '../../shared/sync';

const realFetch = globalThis.fetch;
function answer(status: number, body: unknown) {
  globalThis.fetch = async () => new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
}
afterEach(() => {
  globalThis.fetch = realFetch;
});

const me = {
  user: { id: 'u1', email: 'a@example.test', name: 'Ada' },
  memberships: [],
};

describe('API answers are checked with the shared schemas', () => {
  it('an answer of the expected shape is returned as parsed', async () => {
    answer(200, { results: [{ id: 'm1', status: 'applied', version: 3 }], serverHlc: '2026-03-01T00:00:00.000Z-0000-server' });
    const got = await api.post('/sync/push', { mutations: [] }, pushResponse);
    assert.equal(got.results[0].status, 'applied');
  });

  it('an answer of another shape is refused, naming the field, instead of reaching the screens', async () => {
    answer(200, { results: [{ id: 'm1', status: 'mostly-applied', version: 3 }], serverHlc: 'x' });
    await assert.rejects(api.post('/sync/push', { mutations: [] }, pushResponse), (error: unknown) => {
      assert.ok(error instanceof ApiError);
      assert.equal(error.code, 'bad_response');
      assert.ok(Object.keys(error.fields ?? {}).some((f) => f.startsWith('results')), JSON.stringify(error.fields));
      assert.match(describeError(error), /answer/);
      return true;
    });
  });

  it('a missing field is refused too', async () => {
    answer(200, { user: me.user });
    await assert.rejects(api.get('/me', meResponse), (error: unknown) => error instanceof ApiError && error.code === 'bad_response');
  });

  it('an error answer is still the API error, not a shape error', async () => {
    answer(403, { error: { code: 'forbidden', message: 'Owners cannot edit schedules' } });
    await assert.rejects(api.get('/me', meResponse), (error: unknown) => error instanceof ApiError && error.status === 403 && error.code === 'forbidden');
  });
});
