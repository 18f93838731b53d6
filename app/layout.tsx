import type { Metadata, Viewport } from 'next';
import localFont from 'next/font/local';
import { connection } from 'next/server';
import './globals.css';

// Inter (variable), shipped with the app: nothing is fetched at build or run time.
const inter = localFont({
  src: './fonts/inter-latin-wght-normal.woff2',
  variable: '--font-inter',
  display: 'swap',
  weight: '100 900',
});

export const metadata: Metadata = {
  title: { default: 'Sowcast', template: '%s · Sowcast' },
  description: 'Plan and time wildlife food plots: spray, kill wait, seed ahead of rain, and tell the right person.',
};

export const viewport: Viewport = { themeColor: '#3d7a3a', width: 'device-width', initialScale: 1 };

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page is rendered per request: its scripts carry that request's CSP nonce (proxy.ts). A page
  // prerendered at build time would have scripts without one, which the policy blocks.
  await connection();
  return (
    <html lang="en" className={inter.variable}>
      <body className="min-h-screen bg-ground font-sans text-loam antialiased">{children}</body>
    </html>
  );
}
