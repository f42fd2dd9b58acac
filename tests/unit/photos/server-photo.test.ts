// A stored photo the desk cannot show says why: no link (it is on the server), or the server truly lacks it.
import { describe, expect, it } from 'vitest';
import { ApiError, OfflineError } from '@client/lib/api-client';
import { photoFailureWords } from '@client/components/photos/server-photo';

describe('why a stored photo is not shown', () => {
  it('offline: on the server, connect to see it', () => {
    expect(photoFailureWords(new OfflineError())).toBe('On the server (connect to see it)');
  });
  it('online and answered 404: plainly not on the server', () => {
    expect(photoFailureWords(new ApiError(404, 'not_found', 'The photo’s file is missing from storage.'))).toMatch(/^Not on the server/);
  });
  it('another answer: the server could not send it, with its status', () => {
    expect(photoFailureWords(new ApiError(503, 'unavailable', 'busy'))).toMatch(/could not send this photo \(503\)/);
  });
});
