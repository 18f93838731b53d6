'use client';

import { Camera, ImagePlus, Trash2, X } from 'lucide-react';
import { useEffect, useRef, useState } from 'react';
import { Button } from '@/components/ui/button';
import { apiFetch, errorMessage } from '@/lib/client/api';
import type { UploadDto } from '@/lib/data/uploads';

// The server's limit (lib/storage/photos.ts); checked here too so a phone does not send 40 MB for nothing.
const MAX_BYTES = 15 * 1024 * 1024;

type Item = {
  localId: string;
  name: string;
  preview: string;
  progress: number;
  state: 'uploading' | 'done' | 'error';
  error?: string;
  upload?: UploadDto;
  xhr?: XMLHttpRequest;
};

/**
 * Photos for a check: each file goes up on its own request (XMLHttpRequest, for the upload progress a fetch
 * cannot report) and can be cancelled while it goes. Done photos show the server's thumbnail.
 */
export function PhotoUploads({ plotId, disabled, onChange }: { plotId: string; disabled?: boolean; onChange: (uploadIds: string[]) => void }) {
  const [items, setItems] = useState<Item[]>([]);
  const input = useRef<HTMLInputElement>(null);
  const itemsRef = useRef(items);
  itemsRef.current = items;

  useEffect(() => {
    onChange(items.filter((i) => i.state === 'done' && i.upload).map((i) => i.upload!.id));
  }, [items, onChange]);

  useEffect(
    () => () => {
      for (const item of itemsRef.current) {
        item.xhr?.abort();
        URL.revokeObjectURL(item.preview);
      }
    },
    [],
  );

  const update = (localId: string, change: Partial<Item>) => setItems((list) => list.map((i) => (i.localId === localId ? { ...i, ...change } : i)));
  const drop = (localId: string) =>
    setItems((list) => {
      const gone = list.find((i) => i.localId === localId);
      if (gone) URL.revokeObjectURL(gone.preview);
      return list.filter((i) => i.localId !== localId);
    });

  function send(file: File) {
    const localId = `${Date.now()}-${Math.random().toString(36).slice(2)}`;
    const preview = URL.createObjectURL(file);
    if (file.size > MAX_BYTES) {
      setItems((list) => [...list, { localId, name: file.name, preview, progress: 0, state: 'error', error: `${(file.size / 1024 / 1024).toFixed(1)} MB is over the 15 MB limit for a photo.` }]);
      return;
    }
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/plots/${plotId}/photos`);
    xhr.responseType = 'json';
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable) update(localId, { progress: event.loaded / event.total });
    };
    xhr.onload = () => {
      const body = xhr.response as { upload?: UploadDto; error?: string } | null;
      if (xhr.status === 201 && body?.upload) update(localId, { state: 'done', progress: 1, upload: body.upload, xhr: undefined });
      else update(localId, { state: 'error', xhr: undefined, error: body?.error ?? `The upload failed (HTTP ${xhr.status}); nothing was saved.` });
    };
    xhr.onerror = () => update(localId, { state: 'error', xhr: undefined, error: 'Sowcast could not be reached; the photo was not saved. Try again when you have signal.' });
    xhr.onabort = () => drop(localId);
    const form = new FormData();
    form.append('file', file);
    setItems((list) => [...list, { localId, name: file.name, preview, progress: 0, state: 'uploading', xhr }]);
    xhr.send(form);
  }

  async function remove(item: Item) {
    if (!item.upload) return drop(item.localId);
    try {
      await apiFetch(`/api/uploads/${item.upload.id}`, { method: 'DELETE' });
      drop(item.localId);
    } catch (error) {
      update(item.localId, { error: errorMessage(error) });
    }
  }

  return (
    <div className="space-y-3">
      <input
        ref={input}
        id="check-photos"
        type="file"
        accept="image/jpeg,image/png,image/webp"
        multiple
        className="sr-only"
        aria-label="Add photos"
        disabled={disabled}
        onChange={(event) => {
          for (const file of Array.from(event.target.files ?? [])) send(file);
          event.target.value = '';
        }}
      />
      <Button variant="secondary" className="min-h-14 w-full text-lg" disabled={disabled} onClick={() => input.current?.click()}>
        <Camera className="size-5" aria-hidden="true" />
        Take or add photos
      </Button>
      <p className="text-xs text-loam-soft">JPEG, PNG or WebP, up to 15 MB each. Sowcast keeps a resized copy without the location data phones add.</p>
      {items.length ? (
        <ul className="grid grid-cols-2 gap-3" aria-label="Photos of this check">
          {items.map((item) => (
            <li key={item.localId} className="overflow-hidden rounded-lg border border-ground-line bg-white" data-photo-state={item.state}>
              <img
                src={item.upload?.thumbUrl ?? item.preview}
                alt={item.state === 'done' ? `Photo ${item.name}` : `Preview of ${item.name}`}
                className="aspect-square w-full bg-ground object-cover"
              />
              <div className="space-y-2 p-2 text-xs">
                <p className="truncate font-medium" title={item.name}>
                  {item.name}
                </p>
                {item.state === 'uploading' ? (
                  <>
                    <progress className="h-2 w-full accent-clover" max={1} value={item.progress} aria-label={`Uploading ${item.name}`} />
                    <Button variant="quiet" className="w-full" onClick={() => item.xhr?.abort()}>
                      <X className="size-4" aria-hidden="true" /> Cancel
                    </Button>
                  </>
                ) : item.state === 'error' ? (
                  <>
                    <p role="alert" className="font-medium text-ember">
                      {item.error}
                    </p>
                    <Button variant="quiet" className="w-full" onClick={() => drop(item.localId)}>
                      <X className="size-4" aria-hidden="true" /> Dismiss
                    </Button>
                  </>
                ) : (
                  <>
                    <p className="flex items-center gap-1 font-medium text-clover">
                      <ImagePlus className="size-4" aria-hidden="true" /> Uploaded
                    </p>
                    {item.error ? <p className="text-ember">{item.error}</p> : null}
                    <Button variant="danger-quiet" className="w-full" disabled={disabled} onClick={() => remove(item)}>
                      <Trash2 className="size-4" aria-hidden="true" /> Remove
                    </Button>
                  </>
                )}
              </div>
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
