// A stored photo the desk cannot show says why: no link (it is on the server), a file the server lost, or a photo not uploaded yet.
import { describe, expect, it } from 'vitest';
import { ApiError, OfflineError } from '@client/lib/api-client';
import { photoFailureState, photoFailureWords } from '@client/components/photos/server-photo';

describe('why a stored photo is not shown', () => {
  it('offline: on the server, connect to see it', () => {
    expect(photoFailureWords(new OfflineError())).toBe('On the server (connect to see it)');
  });
  it('online, and the server has the photo but lost its file: file missing on the server', () => {
    const lost = new ApiError(404, 'not_found', 'The photo’s file is missing from storage.', { reason: 'file_missing' });
    expect(photoFailureState(lost)).toBe('file-missing');
    expect(photoFailureWords(lost)).toBe('File missing on the server');
  });
  it('online, and the server never had it: not uploaded yet by the device that took it', () => {
    const never = new ApiError(404, 'not_found', 'No such photo.');
    expect(photoFailureState(never)).toBe('not-uploaded');
    expect(photoFailureWords(never)).toMatch(/^Not on the server yet/);
  });
  it('another answer: the server could not send it, with its status', () => {
    expect(photoFailureWords(new ApiError(503, 'unavailable', 'busy'))).toMatch(/could not send this photo \(503\)/);
  });
});
