// The processes Sowcast runs beside PostgreSQL, in start order: once for `npm start`, once for the
// test run. Each says whether it applies and what it exports to the processes after it.
import { nodeBin } from './common.mjs';

export function services({ webPort }) {
  return [
    {
      name: 'web',
      enabled: true,
      skipReason: '',
      command: nodeBin('next'),
      args: ['start', '-H', '127.0.0.1', '-p', String(webPort)],
      env: {},
      readyUrl: `http://127.0.0.1:${webPort}/api/health`,
    },
  ];
}

export function testServices({ env }) {
  const webPort = new URL(env.SOWCAST_BASE_URL).port;
  return [
    {
      name: 'web',
      build: { label: 'building the app (next build)', command: nodeBin('next'), args: ['build'] },
      command: nodeBin('next'),
      args: ['start', '-H', '127.0.0.1', '-p', webPort],
      env: {},
      readyUrl: `${env.SOWCAST_BASE_URL}/api/health`,
    },
  ];
}
