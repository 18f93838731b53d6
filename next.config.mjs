/** @type {import('next').NextConfig} */
const nextConfig = {
  // Tests build into their own folder so a running `npm start` keeps its build.
  distDir: process.env.NEXT_DIST_DIR || '.next',
  poweredByHeader: false,
  serverExternalPackages: ['pg', 'pg-boss', 'bcryptjs'],
  // Headers every answer gets (OWASP HTTP Headers Cheat Sheet). The Content-Security-Policy (a nonce per
  // page, in proxy.ts; a sandbox for the API, in lib/http.ts) and HSTS (only when the public address is
  // https) are set per request in lib/security-headers.ts.
  async headers() {
    return [
      {
        source: '/:path*',
        headers: [
          { key: 'X-Content-Type-Options', value: 'nosniff' },
          { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
          // Sowcast uses none of these; notifications and service workers are not governed by this header.
          { key: 'Permissions-Policy', value: 'camera=(), microphone=(), geolocation=(), payment=(), usb=(), interest-cohort=()' },
          { key: 'X-Frame-Options', value: 'DENY' },
        ],
      },
    ];
  },
};

export default nextConfig;
