// The processes Sowcast runs beside PostgreSQL, in start order: once for `npm start`, once for the test
// run. Each says whether it applies, how to tell it is ready, and what it exports to the processes after
// it (that is how the web and worker learn where the fakes listen). A hosted service replaces a fake
// through environment variables only.
import path from 'node:path';
import { nodeBin } from './common.mjs';

const tsxNode = (script) => ({ command: process.execPath, args: ['--import', 'tsx', script] });

/** The local fakes; each is skipped when its real service is configured. */
function fakes({ env, dataDir, ports }) {
  const pushDir = path.join(dataDir, 'fake-push');
  return [
    {
      name: 'fake-weather',
      enabled: !env.WEATHER_BASE_URL,
      skipReason: `WEATHER_BASE_URL is set: forecasts come from ${env.WEATHER_BASE_URL}`,
      ...tsxNode('fakes/weather/server.ts'),
      env: { FAKE_WEATHER_PORT: String(ports.weather) },
      readyUrl: `http://127.0.0.1:${ports.weather}/health`,
      exports: { WEATHER_BASE_URL: `http://127.0.0.1:${ports.weather}`, FAKE_WEATHER_URL: `http://127.0.0.1:${ports.weather}` },
      banner: `fake weather      http://127.0.0.1:${ports.weather}  (control API under /_control)`,
    },
    {
      name: 'fake-mail',
      enabled: !env.SMTP_URL,
      skipReason: `SMTP_URL is set: e-mail goes to that server`,
      ...tsxNode('fakes/mail/server.ts'),
      env: { FAKE_SMTP_PORT: String(ports.smtp), FAKE_INBOX_PORT: String(ports.inbox) },
      readyUrl: `http://127.0.0.1:${ports.inbox}/health`,
      exports: { SMTP_URL: `smtp://127.0.0.1:${ports.smtp}`, FAKE_INBOX_URL: `http://127.0.0.1:${ports.inbox}` },
      banner: `fake mail inbox   http://127.0.0.1:${ports.inbox}  (SMTP on 127.0.0.1:${ports.smtp})`,
    },
    {
      name: 'fake-push',
      enabled: env.SOWCAST_FAKE_PUSH !== '0',
      skipReason: 'SOWCAST_FAKE_PUSH=0: only real browser subscriptions are used',
      ...tsxNode('fakes/push/server.ts'),
      env: { FAKE_PUSH_PORT: String(ports.push), FAKE_PUSH_DIR: pushDir },
      readyUrl: `https://127.0.0.1:${ports.push}/health`,
      insecureReady: true,
      exports: {
        FAKE_PUSH_URL: `https://127.0.0.1:${ports.push}`,
        // Push endpoints must be public https hosts; the local fake on loopback is let through, with any
        // origins the environment already lists.
        PUSH_ENDPOINT_ALLOWED_ORIGINS: [env.PUSH_ENDPOINT_ALLOWED_ORIGINS, `https://127.0.0.1:${ports.push}`].filter(Boolean).join(','),
        // The worker trusts the fake's self-signed certificate; real push services keep the system CAs.
        NODE_EXTRA_CA_CERTS: path.join(pushDir, 'cert.pem'),
      },
      banner: `fake push service https://127.0.0.1:${ports.push}  (self-signed; lists what the virtual phones received)`,
    },
  ];
}

export function services({ env, dataDir, webPort }) {
  const ports = {
    weather: Number(env.FAKE_WEATHER_PORT ?? 4010),
    smtp: Number(env.FAKE_SMTP_PORT ?? 2525),
    inbox: Number(env.FAKE_INBOX_PORT ?? 4020),
    push: Number(env.FAKE_PUSH_PORT ?? 4030),
  };
  return [
    ...fakes({ env, dataDir, ports }),
    {
      name: 'demo-phones',
      enabled: env.SOWCAST_FAKE_PUSH !== '0',
      skipReason: '',
      oneShot: true,
      ...tsxNode('db/demo-phones.ts'),
      env: {},
    },
    {
      name: 'web',
      enabled: true,
      // Next's handler behind node:http, so the socket's address reaches the sign-in limits (see the script).
      command: process.execPath,
      args: ['scripts/web-server.mjs', '-H', '127.0.0.1', '-p', String(webPort)],
      env: {},
      readyUrl: `http://127.0.0.1:${webPort}/api/health`,
    },
    {
      name: 'worker',
      enabled: true,
      ...tsxNode('jobs/worker.ts'),
      env: { SOWCAST_DATA_DIR: dataDir },
    },
  ];
}

const TEST_WEB_LIMITS = { TRUSTED_PROXY_HOPS: '1', SIGN_UP_GLOBAL_PER_HOUR: '100000', INVITATIONS_PER_PROPERTY_PER_HOUR: '40' };

export function testServices({ env, workDir, dataDir }) {
  const webPort = new URL(env.SOWCAST_BASE_URL).port;
  const ports = { weather: env.TEST_PORT_WEATHER, smtp: env.TEST_PORT_SMTP, inbox: env.TEST_PORT_INBOX, push: env.TEST_PORT_PUSH };
  return [
    ...fakes({ env: { PUSH_ENDPOINT_ALLOWED_ORIGINS: env.PUSH_ENDPOINT_ALLOWED_ORIGINS }, dataDir, ports }),
    {
      name: 'web',
      build: { label: 'building the app (next build)', command: nodeBin('next'), args: ['build'] },
      command: process.execPath,
      args: ['scripts/web-server.mjs', '-H', '127.0.0.1', '-p', webPort],
      // Every test client comes from loopback and says its own made-up address in X-Forwarded-For, standing in
      // for one trusted proxy in front (tests/support/http.ts); the whole suite's sign-ups share one hour, and the
      // role matrix invites on one property more than 20 times. Exported too, so tests know the numbers.
      env: TEST_WEB_LIMITS,
      exports: TEST_WEB_LIMITS,
      readyUrl: `${env.SOWCAST_BASE_URL}/api/health`,
    },
  ];
}
