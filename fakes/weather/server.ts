// A local stand-in for Open-Meteo's forecast API on loopback, for the demo and the tests: the same request and
// JSON shape (see forecast.ts) with a deterministic invented season (season.ts), plus a control API to put
// weather in by hand and to make it misbehave.
//
//   node --import tsx fakes/weather/server.ts        (port FAKE_WEATHER_PORT, default 4010; 127.0.0.1 only)
//
// Control API (JSON):
//   POST   /_control/events    {kind:'rain', latitude, longitude, date, timeZone?, totalMm, startHour? (14), hours? (4)}
//                              {kind:'cold', latitude, longitude, date, timeZone?, days? (1), minC}
//                              {kind:'dry',  latitude, longitude, date, timeZone?, days}
//                              dates are local dates in timeZone (IANA, default UTC); events hold for the 0.1° cell
//   GET    /_control/events    DELETE /_control/events
//   POST   /_control/mode      {mode:'ok'|'slow'|'fail'|'garbage'|'partial'|'empty'|'limit', delayMs?, times?}
//                              slow waits delayMs (default 15 000) then answers; fail → 500; limit → 429;
//                              garbage → broken JSON; partial → hourly arrays of different lengths; empty → no hours;
//                              times → only the next N forecast requests, then back to ok
//   GET    /_control/mode      POST /_control/reset (events, mode and request log)
//   GET    /_control/requests  {count, recent: [query strings, newest last]} of GET /v1/forecast
//   GET    /health
import http from 'node:http';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { z } from 'zod';
import { EventRejected, makeEvent, type ControlEvent } from './events';
import { BadRequest, forecastAnswer, parseForecastRequest, type ForecastAnswer } from './forecast';

const HOST = '127.0.0.1';
const DEFAULT_PORT = 4010;
const DEFAULT_SLOW_MS = 15_000; // beyond the client's default 10 s timeout
const RECENT_REQUESTS = 50;
const MAX_BODY_BYTES = 64 * 1024;

const modeSchema = z.object({
  mode: z.enum(['ok', 'slow', 'fail', 'garbage', 'partial', 'empty', 'limit']),
  delayMs: z.number().int().min(0).max(600_000).optional(),
  times: z.number().int().min(1).optional(),
});
type Mode = z.infer<typeof modeSchema>['mode'];

export interface FakeWeatherOptions {
  port?: number;
  /** true (default): one JSON line per request on stdout; false: quiet; a function: lines go there. */
  log?: boolean | ((line: Record<string, unknown>) => void);
}

export interface FakeWeather {
  url: string;
  port: number;
  close(): Promise<void>;
}

interface State {
  events: ControlEvent[];
  mode: Mode;
  delayMs: number;
  times: number | null;
  count: number;
  recent: string[];
}

function freshState(): State {
  return { events: [], mode: 'ok', delayMs: DEFAULT_SLOW_MS, times: null, count: 0, recent: [] };
}

function sendJson(res: http.ServerResponse, status: number, body: unknown): void {
  const text = JSON.stringify(body);
  res.writeHead(status, { 'content-type': 'application/json; charset=utf-8', 'content-length': Buffer.byteLength(text) });
  res.end(text);
}

const fail = (res: http.ServerResponse, status: number, reason: string) => sendJson(res, status, { error: true, reason });

async function readJson(req: http.IncomingMessage): Promise<unknown> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of req) {
    size += (chunk as Buffer).length;
    if (size > MAX_BODY_BYTES) throw new BadRequest(`The body is larger than ${MAX_BODY_BYTES} bytes.`);
    chunks.push(chunk as Buffer);
  }
  const text = Buffer.concat(chunks).toString('utf8');
  if (!text.trim()) return {};
  try {
    return JSON.parse(text);
  } catch {
    throw new BadRequest('The body is not JSON.');
  }
}

function describeEvent(e: ControlEvent) {
  const { rain, ...rest } = e;
  return rain ? { ...rest, rainStartsAt: new Date(rain.startMs).toISOString(), hourlyMm: rain.tenthsPerHour.map((t) => t / 10) } : rest;
}

/** What a misbehaving server sends: the start of an answer cut off mid-array, then an HTML error page. */
const GARBAGE = '{"latitude":41.9,"longitude":-87.6,"hourly":{"time":[1818460800,18184<html><body>502 Bad Gateway</body></html>';

function damage(answer: ForecastAnswer, mode: 'partial' | 'empty'): ForecastAnswer {
  const hourly: Record<string, number[]> = {};
  for (const [name, values] of Object.entries(answer.hourly)) {
    // partial: the weather variables stop a day short of `time`, as a writer cut off half-way would leave them
    hourly[name] = mode === 'empty' ? [] : name === 'time' ? values : values.slice(0, Math.max(0, values.length - 24));
  }
  return { ...answer, hourly };
}

export async function startFakeWeather(options: FakeWeatherOptions = {}): Promise<FakeWeather> {
  const state = freshState();
  const waiting = new Set<() => void>();
  const log =
    options.log === false ? null : typeof options.log === 'function' ? options.log : (line: Record<string, unknown>) => console.log(JSON.stringify(line));

  /** Waits, unless the client goes away or the server closes first; true when it is still worth answering. */
  const pause = (ms: number, res: http.ServerResponse) =>
    new Promise<boolean>((resolve) => {
      const done = (answer: boolean) => {
        clearTimeout(timer);
        waiting.delete(stop);
        res.off('close', gone);
        resolve(answer);
      };
      const stop = () => done(false);
      const gone = () => done(false);
      const timer = setTimeout(() => done(!res.destroyed), ms);
      waiting.add(stop);
      res.on('close', gone);
    });

  /** The mode for this forecast request; a counted mode runs out and falls back to ok. */
  const takeMode = (): Mode => {
    const mode = state.mode;
    if (state.times !== null) {
      state.times--;
      if (state.times <= 0) {
        state.mode = 'ok';
        state.times = null;
      }
    }
    return mode;
  };

  async function forecast(url: URL, res: http.ServerResponse): Promise<Mode> {
    state.count++;
    state.recent.push(url.search.replace(/^\?/, ''));
    if (state.recent.length > RECENT_REQUESTS) state.recent.shift();
    const mode = takeMode();
    if (mode === 'fail') return fail(res, 500, 'The forecast server failed (put in by POST /_control/mode).'), mode;
    if (mode === 'limit') return fail(res, 429, 'Too many requests (put in by POST /_control/mode).'), mode;
    if (mode === 'garbage') {
      res.writeHead(200, { 'content-type': 'application/json; charset=utf-8' });
      res.end(GARBAGE);
      return mode;
    }
    if (mode === 'slow' && !(await pause(state.delayMs, res))) return mode;
    const started = performance.now();
    const request = parseForecastRequest(url.searchParams);
    let answer = forecastAnswer(request, state.events);
    answer.generationtime_ms = Math.round((performance.now() - started) * 1000) / 1000;
    if (mode === 'partial' || mode === 'empty') answer = damage(answer, mode);
    sendJson(res, 200, answer);
    return mode;
  }

  async function control(req: http.IncomingMessage, url: URL, res: http.ServerResponse): Promise<void> {
    const route = `${req.method} ${url.pathname}`;
    switch (route) {
      case 'POST /_control/events': {
        const event = makeEvent(await readJson(req));
        state.events.push(event);
        return sendJson(res, 201, { event: describeEvent(event) });
      }
      case 'GET /_control/events':
        return sendJson(res, 200, { events: state.events.map(describeEvent) });
      case 'DELETE /_control/events':
        state.events = [];
        return sendJson(res, 200, { events: [] });
      case 'POST /_control/mode': {
        const parsed = modeSchema.safeParse(await readJson(req));
        if (!parsed.success) {
          const issue = parsed.error.issues[0];
          throw new BadRequest(`${issue.path.join('.') || 'body'}: ${issue.message}`);
        }
        state.mode = parsed.data.mode;
        state.delayMs = parsed.data.delayMs ?? DEFAULT_SLOW_MS;
        state.times = parsed.data.mode === 'ok' ? null : (parsed.data.times ?? null);
        return sendJson(res, 200, { mode: state.mode, delayMs: state.delayMs, times: state.times });
      }
      case 'GET /_control/mode':
        return sendJson(res, 200, { mode: state.mode, delayMs: state.delayMs, times: state.times });
      case 'POST /_control/reset':
        Object.assign(state, freshState());
        return sendJson(res, 200, { ok: true });
      case 'GET /_control/requests':
        return sendJson(res, 200, { count: state.count, recent: state.recent });
      default:
        return fail(res, 404, `No control endpoint ${route}.`);
    }
  }

  const server = http.createServer((req, res) => {
    const started = performance.now();
    const url = new URL(req.url ?? '/', `http://${HOST}`);
    let mode: Mode | undefined;
    res.on('close', () => {
      log?.({ time: new Date().toISOString(), service: 'fake-weather', method: req.method, path: url.pathname, status: res.headersSent ? res.statusCode : null, ms: Math.round(performance.now() - started), ...(mode && mode !== 'ok' ? { mode } : {}) });
    });
    const handle = async () => {
      if (url.pathname === '/v1/forecast') {
        if (req.method !== 'GET') return fail(res, 405, 'Use GET.');
        mode = await forecast(url, res);
        return;
      }
      if (url.pathname === '/health' && req.method === 'GET') return sendJson(res, 200, { ok: true, service: 'fake-weather' });
      if (url.pathname.startsWith('/_control/')) return control(req, url, res);
      return fail(res, 404, `Not found: ${url.pathname}`);
    };
    handle().catch((error: unknown) => {
      if (res.headersSent) return res.destroy();
      if (error instanceof BadRequest || error instanceof EventRejected) return fail(res, 400, error.message);
      fail(res, 500, `The stand-in broke: ${error instanceof Error ? error.message : String(error)}`);
    });
  });

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? DEFAULT_PORT, HOST, () => {
      server.off('error', reject);
      resolve();
    });
  });
  const port = (server.address() as { port: number }).port;

  return {
    url: `http://${HOST}:${port}`,
    port,
    close: () =>
      new Promise<void>((resolve, reject) => {
        for (const stop of [...waiting]) stop();
        server.close((error) => (error ? reject(error) : resolve()));
        server.closeAllConnections();
      }),
  };
}

function portFromEnv(): number {
  const raw = process.env.FAKE_WEATHER_PORT?.trim();
  if (!raw) return DEFAULT_PORT;
  const port = Number(raw);
  if (!Number.isInteger(port) || port < 0 || port > 65_535) throw new Error(`FAKE_WEATHER_PORT must be a port number, not ${JSON.stringify(raw)}.`);
  return port;
}

const isMain = process.argv[1] !== undefined && import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href;
if (isMain) {
  startFakeWeather({ port: portFromEnv() })
    .then((fake) => {
      console.log(JSON.stringify({ time: new Date().toISOString(), service: 'fake-weather', listening: fake.url }));
      let stopping = false;
      const stop = (signal: string) => {
        if (stopping) return;
        stopping = true;
        fake.close().then(
          () => {
            console.log(JSON.stringify({ time: new Date().toISOString(), service: 'fake-weather', stopped: signal }));
            process.exit(0);
          },
          (error: unknown) => {
            console.error(error);
            process.exit(1);
          },
        );
      };
      process.on('SIGTERM', () => stop('SIGTERM'));
      process.on('SIGINT', () => stop('SIGINT'));
    })
    .catch((error: unknown) => {
      console.error(JSON.stringify({ time: new Date().toISOString(), service: 'fake-weather', error: error instanceof Error ? error.message : String(error) }));
      process.exit(1);
    });
}
