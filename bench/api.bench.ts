// The calendar events route and the dashboard under autocannon (its programmatic API), for the demo club and
// the 1,000-plot club, at 10 and 100 connections. Latency percentiles come from every response's own time
// (autocannon's 'response' event), so p95 is measured rather than read off a coarser bucket.
import autocannon from 'autocannon';
import { addDays } from '@/lib/schedule/local-dates';
import { percentile } from './support';
import type { BenchClub, Web } from './web';

export interface ApiRow {
  route: string;
  club: BenchClub['name'];
  plots: number;
  connections: number;
  seconds: number;
  requests: number;
  requestsPerSecond: number;
  p50Ms: number;
  p95Ms: number;
  p99Ms: number;
  errors: number;
  non2xx: number;
}

/** The range the month view asks for: the weeks around this month (as the season calendar does). */
function calendarRange(today: string) {
  return { from: addDays(today, -7), to: addDays(today, 42) };
}

function load(url: string, cookie: string, connections: number, seconds: number) {
  const latencies: number[] = [];
  return new Promise<{ result: autocannon.Result; latencies: number[] }>((resolve, reject) => {
    const instance = autocannon({ url, connections, duration: seconds, headers: { cookie }, timeout: 30 }, (error, result) =>
      error ? reject(error) : resolve({ result, latencies }),
    );
    instance.on('response', (_client: unknown, _status: number, _bytes: number, responseTime: number) => latencies.push(responseTime));
  });
}

export async function runApiBenchmark(web: Web, o: { seconds?: number; connections?: number[] } = {}): Promise<ApiRow[]> {
  const seconds = o.seconds ?? 10;
  const today = new Date().toISOString().slice(0, 10);
  const { from, to } = calendarRange(today);
  const routes = [
    { route: 'GET /api/calendar', path: `/api/calendar?from=${from}&to=${to}` },
    { route: 'GET /api/dashboard', path: '/api/dashboard' },
  ];
  const rows: ApiRow[] = [];
  for (const club of web.clubs) {
    for (const r of routes) {
      // Warm up: the first requests compile and cache what later ones reuse; they are not counted.
      for (let i = 0; i < 5; i++) {
        const answer = await fetch(`${web.baseUrl}${r.path}`, { headers: { cookie: club.cookie } });
        if (answer.status !== 200) throw new Error(`${r.route} for the ${club.name} club answered ${answer.status}: ${(await answer.text()).slice(0, 200)}`);
        await answer.arrayBuffer();
      }
      for (const connections of o.connections ?? [10, 100]) {
        const { result, latencies } = await load(`${web.baseUrl}${r.path}`, club.cookie, connections, seconds);
        latencies.sort((a, b) => a - b);
        rows.push({
          route: r.route,
          club: club.name,
          plots: club.plots,
          connections,
          seconds: result.duration,
          requests: result.requests.total,
          requestsPerSecond: result.requests.total / result.duration,
          p50Ms: Math.round(percentile(latencies, 50)),
          p95Ms: Math.round(percentile(latencies, 95)),
          p99Ms: Math.round(percentile(latencies, 99)),
          errors: result.errors + result.timeouts,
          non2xx: result.non2xx,
        });
      }
    }
  }
  return rows;
}
