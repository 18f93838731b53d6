'use client';

import { ApiError } from '@/lib/client/api';

/**
 * Sends a form with XMLHttpRequest: fetch reports no upload progress, and XHR's abort() cancels cleanly.
 * Errors come back as the same ApiError that apiFetch throws, so forms show the server's message.
 */
export function uploadForm<T>(url: string, form: FormData, onProgress: (fraction: number) => void): { done: Promise<T>; cancel: () => void } {
  const xhr = new XMLHttpRequest();
  const done = new Promise<T>((resolve, reject) => {
    xhr.open('POST', url);
    xhr.responseType = 'text';
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable && event.total > 0) onProgress(event.loaded / event.total);
    };
    xhr.onload = () => {
      let payload: { error?: unknown; fields?: unknown } | null = null;
      try {
        payload = xhr.responseText ? JSON.parse(xhr.responseText) : null;
      } catch {
        payload = null;
      }
      if (xhr.status >= 200 && xhr.status < 300) return resolve(payload as T);
      const message =
        typeof payload?.error === 'string'
          ? payload.error
          : xhr.status === 413
            ? 'The file is too large; nothing was saved.'
            : `The upload failed (HTTP ${xhr.status}). Nothing was saved.`;
      const fields = payload?.fields && typeof payload.fields === 'object' ? (payload.fields as Record<string, string>) : {};
      reject(new ApiError(xhr.status, message, fields));
    };
    xhr.onerror = () => reject(new ApiError(0, 'Sowcast could not be reached. Check your connection; nothing was saved.'));
    xhr.onabort = () => reject(new ApiError(0, 'Upload cancelled; nothing was saved.'));
    xhr.send(form);
  });
  return { done, cancel: () => xhr.abort() };
}

export function UploadProgress({ fraction, label }: { fraction: number; label: string }) {
  const percent = Math.round(fraction * 100);
  return (
    <div className="flex min-w-48 flex-1 items-center gap-3">
      <progress className="h-3 w-full accent-clover" max={100} value={percent} aria-label={label} />
      <span className="tabular w-12 text-right text-sm text-loam-soft">{percent}%</span>
    </div>
  );
}
