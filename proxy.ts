import { NextResponse, type NextRequest } from 'next/server';
import { pageContentSecurityPolicy, publicUrlIsHttps, STRICT_TRANSPORT_SECURITY } from '@/lib/security-headers';

/**
 * Every page gets a Content Security Policy with a fresh nonce; Next reads the nonce from the request's
 * Content-Security-Policy header and puts it on the scripts it writes (Next.js CSP guide). Layouts are not
 * told the URL they render, so the path is passed along too: the signed-in area sends a signed-out visitor
 * to sign-in and back again.
 */
export function proxy(request: NextRequest) {
  const nonce = btoa(String.fromCharCode(...crypto.getRandomValues(new Uint8Array(16))));
  const https = publicUrlIsHttps();
  const policy = pageContentSecurityPolicy(nonce, { development: process.env.NODE_ENV === 'development', https });
  const headers = new Headers(request.headers);
  headers.set('x-sowcast-path', request.nextUrl.pathname + request.nextUrl.search);
  headers.set('x-nonce', nonce);
  headers.set('Content-Security-Policy', policy);
  const response = NextResponse.next({ request: { headers } });
  response.headers.set('Content-Security-Policy', policy);
  if (https) response.headers.set('Strict-Transport-Security', STRICT_TRANSPORT_SECURITY);
  return response;
}

export const config = {
  // Pages only. API routes set their own headers in route() (lib/http.ts): a proxy in front of them would
  // make Next buffer request bodies before the handler's streaming size limit could refuse them.
  matcher: [
    {
      source: '/((?!api/|_next/static|_next/image|favicon.ico|sw.js).*)',
      missing: [
        { type: 'header', key: 'next-router-prefetch' },
        { type: 'header', key: 'purpose', value: 'prefetch' },
      ],
    },
  ],
};
