import { NextResponse, type NextRequest } from 'next/server';

/**
 * Layouts are not told the URL they render. The signed-in area needs it to send a signed-out visitor to
 * sign-in and back again, so the path is passed along as a request header.
 */
export function proxy(request: NextRequest) {
  const headers = new Headers(request.headers);
  headers.set('x-sowcast-path', request.nextUrl.pathname + request.nextUrl.search);
  return NextResponse.next({ request: { headers } });
}

export const config = {
  matcher: ['/properties/:path*', '/plots/:path*', '/settings/:path*', '/my-steps/:path*'],
};
