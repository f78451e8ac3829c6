import assert from 'node:assert/strict';
import { test } from 'node:test';
import { absoluteApiUrl, apiUrl } from '../../lib/api-base';

test('an API path is relative when the app and the API share an origin', () => {
  assert.equal(apiUrl('/health', ''), '/api/health');
  assert.equal(apiUrl('/photos/p1/thumb', ''), '/api/photos/p1/thumb');
});

test('a configured API origin prefixes every path', () => {
  assert.equal(apiUrl('/health', 'https://api.example.test'), 'https://api.example.test/api/health');
});

test('what leaves the page gets the page origin when no API origin is configured', () => {
  assert.equal(absoluteApiUrl('/panels/p1/directory.pdf', '', 'http://127.0.0.1:8090'), 'http://127.0.0.1:8090/api/panels/p1/directory.pdf');
  assert.equal(absoluteApiUrl('/x', 'https://api.example.test', 'http://127.0.0.1:8090'), 'https://api.example.test/api/x');
});
