/** A photo stored on the server, fetched with the session's token (an <img src> could not send it). */
import { useEffect, useMemo, useState } from 'react';
import { apiFetch } from '@client/lib/api-client';

export function useObjectUrl(blob: Blob | undefined): string | undefined {
  const url = useMemo(() => (blob ? URL.createObjectURL(blob) : undefined), [blob]);
  useEffect(() => () => (url ? URL.revokeObjectURL(url) : undefined), [url]);
  return url;
}

export function ServerPhoto({ id, alt }: { id: string; alt: string }) {
  const [blob, setBlob] = useState<Blob | undefined>();
  const [failed, setFailed] = useState(false);
  useEffect(() => {
    let live = true;
    apiFetch(`/api/photos/${id}`)
      .then((r) => r.blob())
      .then((b) => live && setBlob(b))
      .catch(() => live && setFailed(true));
    return () => {
      live = false;
    };
  }, [id]);
  const url = useObjectUrl(blob);
  if (failed) return <div className="grid h-32 place-items-center bg-paper text-sm text-ink-soft">On the server (connect to see it)</div>;
  return url ? <img src={url} alt={alt} className="h-32 w-full object-cover" /> : <div className="h-32 bg-paper" />;
}
