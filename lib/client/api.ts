/**
 * The browser's side of the JSON API: one fetch helper that turns every non-2xx answer into an ApiError
 * carrying the server's message and per-field messages, so forms can show them where they belong.
 */
export class ApiError extends Error {
  constructor(
    public readonly status: number,
    message: string,
    public readonly fields: Record<string, string> = {},
  ) {
    super(message);
  }
}

const OFFLINE = 'Sowcast could not be reached. Check your connection; nothing was changed.';

export async function apiFetch<T>(url: string, init: { method?: string; body?: unknown } = {}): Promise<T> {
  let response: Response;
  try {
    response = await fetch(url, {
      method: init.method ?? 'GET',
      headers: init.body === undefined ? { Accept: 'application/json' } : { Accept: 'application/json', 'Content-Type': 'application/json' },
      body: init.body === undefined ? undefined : JSON.stringify(init.body),
      credentials: 'same-origin',
      cache: 'no-store',
    });
  } catch {
    throw new ApiError(0, OFFLINE);
  }
  if (response.status === 204) return undefined as T;
  const payload = (await response.json().catch(() => null)) as
    | (Record<string, unknown> & { error?: unknown; fields?: unknown })
    | null;
  if (!response.ok) {
    const message =
      typeof payload?.error === 'string'
        ? payload.error
        : response.status === 401
          ? 'Your session has ended. Sign in again.'
          : `The request failed (HTTP ${response.status}). Nothing was changed.`;
    const fields =
      payload?.fields && typeof payload.fields === 'object' ? (payload.fields as Record<string, string>) : {};
    throw new ApiError(response.status, message, fields);
  }
  return payload as T;
}

export const errorMessage = (error: unknown) =>
  error instanceof Error ? error.message : 'Something went wrong. Nothing was changed.';

/** Query keys in one place, so a change in one screen refreshes the others that show the same thing. */
export const queryKeys = {
  properties: ['properties'] as const,
  plots: (propertyId: string) => ['properties', propertyId, 'plots'] as const,
  members: (propertyId: string) => ['properties', propertyId, 'members'] as const,
  invitations: (propertyId: string) => ['properties', propertyId, 'invitations'] as const,
  invitation: (token: string) => ['invitation', token] as const,
  weather: (propertyId: string) => ['properties', propertyId, 'weather'] as const,
  pushDevices: ['settings', 'push'] as const,
};
