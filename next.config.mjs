/** @type {import('next').NextConfig} */
const nextConfig = {
  // Tests build into their own folder so a running `npm start` keeps its build.
  distDir: process.env.NEXT_DIST_DIR || '.next',
  poweredByHeader: false,
  serverExternalPackages: ['pg', 'pg-boss', 'bcryptjs'],
};

export default nextConfig;
