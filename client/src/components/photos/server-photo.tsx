/** A photo stored on the server, fetched with the session's token (an <img src> could not send it). */
import { useEffect, useMemo, useState } from 'react';
import { ApiError, apiFetch, OfflineError } from '@client/lib/api-client';

/** How fetching a stored photo went: the card under it says so rather than a fixed "On the server". */
export type ServerPhotoState = 'loading' | 'shown' | 'offline' | 'file-missing' | 'not-uploaded' | 'failed';

/** What a failed fetch means: no link, a file the server lost, a photo not uploaded yet, or another fault. */
export function photoFailureState(err: unknown): Exclude<ServerPhotoState, 'loading' | 'shown'> {
  if (err instanceof OfflineError) return 'offline';
  if (err instanceof ApiError && err.status === 404) {
    const reason = (err.details as { reason?: unknown } | undefined)?.reason;
    return reason === 'file_missing' ? 'file-missing' : 'not-uploaded';
  }
  return 'failed';
}

/** Why a stored photo cannot be shown, in words (under the thumbnail's place). */
export function photoFailureWords(err: unknown): string {
  switch (photoFailureState(err)) {
    case 'offline':
      return 'On the server (connect to see it)';
    case 'file-missing':
      return 'File missing on the server';
    case 'not-uploaded':
      return 'Not on the server yet: the device that took it has not uploaded it';
    default:
      return err instanceof ApiError ? `The server could not send this photo (${err.status}); try again later` : 'This photo could not be shown';
  }
}

export function useObjectUrl(blob: Blob | undefined): string | undefined {
  const url = useMemo(() => (blob ? URL.createObjectURL(blob) : undefined), [blob]);
  useEffect(() => () => (url ? URL.revokeObjectURL(url) : undefined), [url]);
  return url;
}

export function ServerPhoto({ id, alt, onState }: { id: string; alt: string; onState?: (id: string, state: ServerPhotoState) => void }) {
  const [blob, setBlob] = useState<Blob | undefined>();
  const [failed, setFailed] = useState<string | null>(null);
  useEffect(() => {
    let live = true;
    onState?.(id, 'loading');
    apiFetch(`/api/photos/${id}`)
      .then((r) => r.blob())
      .then((b) => {
        if (!live) return;
        setBlob(b);
        onState?.(id, 'shown');
      })
      .catch((err: unknown) => {
        if (!live) return;
        setFailed(photoFailureWords(err));
        onState?.(id, photoFailureState(err));
      });
    return () => {
      live = false;
    };
  }, [id, onState]);
  const url = useObjectUrl(blob);
  if (failed)
    return (
      <div className="grid h-32 place-items-center bg-paper p-2 text-center text-sm text-ink-soft" data-testid="photo-unavailable">
        {failed}
      </div>
    );
  return url ? <img src={url} alt={alt} className="h-32 w-full object-cover" /> : <div className="h-32 bg-paper" />;
}
