/** A photo stored on the server, fetched with the session's token (an <img src> could not send it). */
import { useEffect, useMemo, useState } from 'react';
import { ApiError, apiFetch, OfflineError } from '@client/lib/api-client';

/** Why a stored photo cannot be shown, in words: no link, or the server truly lacks it. */
export function photoFailureWords(err: unknown): string {
  if (err instanceof OfflineError) return 'On the server (connect to see it)';
  if (err instanceof ApiError && err.status === 404) return 'Not on the server: this photo was never uploaded, or its file is lost';
  if (err instanceof ApiError) return `The server could not send this photo (${err.status}); try again later`;
  return 'This photo could not be shown';
}

export function useObjectUrl(blob: Blob | undefined): string | undefined {
  const url = useMemo(() => (blob ? URL.createObjectURL(blob) : undefined), [blob]);
  useEffect(() => () => (url ? URL.revokeObjectURL(url) : undefined), [url]);
  return url;
}

export function ServerPhoto({ id, alt }: { id: string; alt: string }) {
  const [blob, setBlob] = useState<Blob | undefined>();
  const [failed, setFailed] = useState<string | null>(null);
  useEffect(() => {
    let live = true;
    apiFetch(`/api/photos/${id}`)
      .then((r) => r.blob())
      .then((b) => live && setBlob(b))
      .catch((err: unknown) => live && setFailed(photoFailureWords(err)));
    return () => {
      live = false;
    };
  }, [id]);
  const url = useObjectUrl(blob);
  if (failed)
    return (
      <div className="grid h-32 place-items-center bg-paper p-2 text-center text-sm text-ink-soft" data-testid="photo-unavailable">
        {failed}
      </div>
    );
  return url ? <img src={url} alt={alt} className="h-32 w-full object-cover" /> : <div className="h-32 bg-paper" />;
}
