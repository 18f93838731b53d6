/**
 * Where to go after signing in. Only a path on this site is followed, so a crafted link cannot send
 * someone elsewhere after they type their password.
 */
export function safeCallbackUrl(value: string | string[] | null | undefined, fallback = '/properties'): string {
  const raw = Array.isArray(value) ? value[0] : value;
  if (!raw) return fallback;
  // "//host" and "/\host" are read by browsers as another origin.
  if (!raw.startsWith('/') || raw.startsWith('//') || raw.startsWith('/\\')) return fallback;
  if (/[\u0000-\u001f]/.test(raw)) return fallback;
  return raw;
}

export const signInPath = (callbackUrl?: string) =>
  callbackUrl ? `/sign-in?callbackUrl=${encodeURIComponent(callbackUrl)}` : '/sign-in';

export const signUpPath = (callbackUrl?: string, email?: string) => {
  const params = new URLSearchParams();
  if (callbackUrl) params.set('callbackUrl', callbackUrl);
  if (email) params.set('email', email);
  const query = params.toString();
  return query ? `/sign-up?${query}` : '/sign-up';
};
