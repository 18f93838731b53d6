// Hostile uploads against the three upload routes (POST /api/plots/[plotId]/boundary, /photos, /soil-tests):
// each is refused with a message and leaves no uploads row, no soil test, no change to the plot and no file
// under $SOWCAST_DATA_DIR/uploads. The 50 MB case is streamed over a raw HTTP/1.1 connection (chunked, RFC 9112
// §7.1, and with a declared Content-Length, RFC 9110 §8.6) to show the server refuses early: the answer comes
// back before the client has sent the file, and the server's resident memory never grows by the file's size.
import { readdirSync, readFileSync, readlinkSync } from 'node:fs';
import http from 'node:http';
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPlot, createProperty, SESSION_COOKIE, signedInUser, baseUrl, type Client } from '../support/http';
import { testDb } from '../support/db';
import { fileForm, orphanFiles, sendForm, uploadRowCount } from './upload-helpers';

const db = testDb();
let owner: Client;
let plotId: string;

const ROUTES = ['boundary', 'photos', 'soil-tests'] as const;
type Upload = (typeof ROUTES)[number];

beforeAll(async () => {
  owner = (await signedInUser('upload-abuse')).client;
  const property = await createProperty(owner);
  plotId = (await createPlot(owner, property.id, { acres: 0.75 })).id;
});

afterAll(async () => {
  await db.destroy();
});

/** Everything a refused upload must leave as it was. */
async function state() {
  return {
    uploads: await uploadRowCount(db, plotId),
    soilTests: (await db.selectFrom('soil_tests').select('id').where('plot_id', '=', plotId).execute()).length,
    plot: await db.selectFrom('plots').selectAll().where('id', '=', plotId).executeTakeFirstOrThrow(),
  };
}

// An ELF header (System V ABI, "\x7fELF", 64-bit little-endian) followed by zeros: a Linux executable.
const ELF = (() => {
  const bytes = new Uint8Array(8192);
  bytes.set([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]);
  return bytes;
})();
// A Windows executable: "MZ" DOS header with the PE offset (Microsoft PE/COFF specification §2).
const PE = (() => {
  const bytes = new Uint8Array(4096);
  bytes.set([0x4d, 0x5a, 0x90, 0]);
  bytes.set([0x80, 0, 0, 0], 0x3c);
  bytes.set([0x50, 0x45, 0, 0], 0x80);
  return bytes;
})();

const GPX_HEAD = '<?xml version="1.0" encoding="UTF-8"?>\n<gpx version="1.1" creator="test" xmlns="http://www.topografix.com/GPX/1/1"><trk><trkseg>';
const SQUARE = [[-100, 45], [-99.999, 45], [-99.999, 45.001], [-100, 45.001], [-100, 45]];
// The "billion laughs" entity expansion (W3C XML 1.0 §4.2; OWASP XML External Entity Prevention cheat sheet).
const LAUGHS = `<?xml version="1.0"?>\n<!DOCTYPE kml [\n<!ENTITY lol "lol">\n${Array.from({ length: 9 }, (_, i) => `<!ENTITY lol${i + 1} "${`&lol${i || ''};`.repeat(10)}">`).join('\n')}\n]>\n<kml xmlns="http://www.opengis.net/kml/2.2"><Placemark><name>&lol9;</name></Placemark></kml>`;
// An external entity reading a local file (XXE; OWASP cheat sheet, CWE-611).
const XXE = `<?xml version="1.0"?>\n<!DOCTYPE gpx [<!ENTITY xxe SYSTEM "file:///etc/passwd">]>\n${GPX_HEAD.split('\n')[1]}<name>&xxe;</name><trkpt lat="45" lon="-100"/></trkseg></trk></gpx>`;

type Case = [what: string, form: () => FormData, status: number | number[], message: RegExp];

const BOUNDARY_CASES: Case[] = [
  ['GPX cut off mid-element', () => fileForm('cut.gpx', `${GPX_HEAD}<trkpt lat="45" lon="-100"/><trkpt lat="45" lo`), 400, /not well-formed XML/],
  ['KML with mismatched tags', () => fileForm('bad.kml', '<kml xmlns="http://www.opengis.net/kml/2.2"><Placemark><Polygon></Placemark></kml>'), 400, /not well-formed XML/],
  ['KML cut off', () => fileForm('cut.kml', '<?xml version="1.0"?><kml xmlns="http://www.opengis.net/kml/2.2"><Placemark><Polygon><outerBoundaryIs><LinearRing><coordinates>-100,45 -99.999,45'), 400, /not well-formed XML|no usable|at least three/],
  ['GeoJSON cut off', () => fileForm('cut.geojson', JSON.stringify({ type: 'Polygon', coordinates: [SQUARE] }).slice(0, 40)), 400, /GeoJSON|JSON/],
  ['GeoJSON with text for coordinates', () => fileForm('text.geojson', JSON.stringify({ type: 'Polygon', coordinates: [SQUARE.map(([x, y]) => [String(x), String(y)])] })), 400, /coordinates|position/i],
  ['GeoJSON with a latitude beyond 90° (RFC 7946 §3.1.1 / WGS 84)', () => fileForm('far.geojson', JSON.stringify({ type: 'Polygon', coordinates: [[[-100, 95], [-99.999, 95], [-99.999, 95.001], [-100, 95]]] })), 400, /latitude|coordinates|position|range/i],
  ['GeoJSON nested 100,000 arrays deep', () => fileForm('deep.geojson', `{"type":"Polygon","coordinates":${'['.repeat(100_000)}${']'.repeat(100_000)}}`), 400, /coordinates|GeoJSON|position/i],
  ['the "billion laughs" entity bomb in KML', () => fileForm('laughs.kml', LAUGHS), 400, /DOCTYPE or XML entities/],
  ['an external entity (XXE) in GPX', () => fileForm('xxe.gpx', XXE), 400, /DOCTYPE or XML entities/],
  ['a Linux executable renamed .gpx', () => fileForm('field.gpx', ELF), 400, /not a text file|GPX|XML/],
  ['a Windows executable renamed .kml', () => fileForm('field.kml', PE), 400, /not a text file|KML|XML/],
  ['a zero-byte file', () => fileForm('empty.geojson', new Uint8Array(0)), 400, /empty/],
];

const PHOTO_CASES: Case[] = [
  ['a Linux executable renamed .jpg', () => fileForm('photo.jpg', ELF, 'image/jpeg'), 415, /JPEG, PNG or WebP/],
  ['a Windows executable renamed .png', () => fileForm('photo.png', PE, 'image/png'), 415, /JPEG, PNG or WebP/],
  ['an SVG with script named .png', () => fileForm('photo.png', '<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>', 'image/png'), 415, /JPEG, PNG or WebP/],
  ['a GPX track named .jpg', () => fileForm('photo.jpg', `${GPX_HEAD}</trkseg></trk></gpx>`, 'image/jpeg'), 415, /JPEG, PNG or WebP/],
  ['a PNG signature with nothing after it (truncated, PNG spec §5.2)', () => fileForm('cut.png', new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]), 'image/png'), [400, 415], /could not be read|JPEG, PNG or WebP/],
  ['a zero-byte file', () => fileForm('empty.jpg', new Uint8Array(0), 'image/jpeg'), 400, /empty/],
];

const SOIL_CASES: Case[] = [
  ['a Linux executable renamed .pdf', () => fileForm('report.pdf', ELF, 'application/pdf'), 415, /PDF, a JPEG or PNG picture, or the lab’s CSV/],
  ['a Windows executable renamed .csv', () => fileForm('lab.csv', PE, 'text/csv'), 415, /this file is EXE/],
  ['a GPX track renamed .csv', () => fileForm('lab.csv', `${GPX_HEAD}</trkseg></trk></gpx>`, 'text/csv'), 415, /this file is XML/],
  ['a CSV cut off inside a quoted field', () => fileForm('lab.csv', 'pH,P,K\n"6.', 'text/csv'), 400, /./],
  ['a zero-byte file', () => fileForm('empty.pdf', new Uint8Array(0), 'application/pdf'), 400, /empty/],
];

const CASES: Record<Upload, Case[]> = { boundary: BOUNDARY_CASES, photos: PHOTO_CASES, 'soil-tests': SOIL_CASES };

describe('malformed and disguised files are refused with a message, and nothing is stored', () => {
  for (const route of ROUTES) {
    for (const [what, form, status, message] of CASES[route]) {
      it(`${route}: ${what} → ${status}`, async () => {
        const allowed = ([] as number[]).concat(status);
        const before = await state();
        const orphans = await orphanFiles(db);
        const res = await sendForm(owner, `/api/plots/${plotId}/${route}`, form());
        expect(allowed, res.text.slice(0, 300)).toContain(res.status);
        expect(typeof res.body.error).toBe('string');
        expect(res.body.error).toMatch(message);
        // The upload forms show fields.file under the file input (DEVELOPERS.md, "Errors and input").
        expect(typeof res.body.fields?.file).toBe('string');
        expect(await state()).toEqual(before);
        expect(await orphanFiles(db)).toEqual(orphans);
      }, 30_000);
    }
  }
});

// ---- 50 MB, streamed --------------------------------------------------------------------------------------

const FIFTY_MB = 50 * 1024 * 1024;
const LIMITS: Record<Upload, { bytes: number; label: RegExp; filename: string; type: string }> = {
  boundary: { bytes: 2 * 1024 * 1024, label: /2 MB/, filename: 'huge.gpx', type: 'application/gpx+xml' },
  photos: { bytes: 15 * 1024 * 1024, label: /15 MB/, filename: 'huge.jpg', type: 'image/jpeg' },
  'soil-tests': { bytes: 10 * 1024 * 1024, label: /10 MB/, filename: 'huge.pdf', type: 'application/pdf' },
};

/** The pid of the process listening on the server's port, from /proc/net/tcp{,6} and each process's fd links (proc(5)). */
function serverPid(): number {
  const port = Number(new URL(baseUrl()).port);
  const hexPort = port.toString(16).toUpperCase().padStart(4, '0');
  const inodes = new Set<string>();
  for (const table of ['/proc/net/tcp', '/proc/net/tcp6']) {
    let text = '';
    try {
      text = readFileSync(table, 'utf8');
    } catch {
      continue;
    }
    for (const line of text.split('\n').slice(1)) {
      const cols = line.trim().split(/\s+/);
      // local_address is HEXIP:HEXPORT; state 0A is LISTEN.
      if (cols[1]?.endsWith(`:${hexPort}`) && cols[3] === '0A') inodes.add(cols[9]);
    }
  }
  for (const pid of readdirSync('/proc').filter((p) => /^\d+$/.test(p))) {
    let fds: string[];
    try {
      fds = readdirSync(`/proc/${pid}/fd`);
    } catch {
      continue;
    }
    for (const fd of fds) {
      try {
        const link = readlinkSync(`/proc/${pid}/fd/${fd}`);
        const m = /^socket:\[(\d+)\]$/.exec(link);
        if (m && inodes.has(m[1])) return Number(pid);
      } catch {
        /* the fd closed meanwhile */
      }
    }
  }
  throw new Error(`no process listens on port ${port}`);
}

/** VmRSS in bytes (proc(5), /proc/[pid]/status, kB). */
function rssBytes(pid: number): number {
  const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  return m ? Number(m[1]) * 1024 : NaN;
}

interface StreamResult {
  status: number;
  body: any;
  sentBytes: number;
  rssGrowthBytes: number;
}

/**
 * Sends a multipart body of `size` bytes in 256 KiB chunks, respecting back-pressure, and stops writing as
 * soon as the answer arrives. Memory of the server process is sampled every 10 ms while it runs.
 */
function streamUpload(route: Upload, size: number, declareLength: boolean): Promise<StreamResult> {
  const { filename, type } = LIMITS[route];
  const boundary = `----abuse${randomUUID()}`;
  const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${filename}"\r\nContent-Type: ${type}\r\n\r\n`);
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  // Filler that starts like the file it claims to be, so nothing refuses it for its first bytes.
  const chunk = Buffer.alloc(256 * 1024, 0x20);
  const url = new URL(`${baseUrl()}/api/plots/${plotId}/${route}`);
  const pid = serverPid();
  const rssBefore = rssBytes(pid);
  let rssPeak = rssBefore;
  const sampler = setInterval(() => {
    rssPeak = Math.max(rssPeak, rssBytes(pid));
  }, 10);
  return new Promise((resolve, reject) => {
    let sentBytes = 0;
    let answered = false;
    const headers: Record<string, string> = {
      'content-type': `multipart/form-data; boundary=${boundary}`,
      cookie: `${SESSION_COOKIE}=${owner.cookie(SESSION_COOKIE)}`,
      accept: 'application/json',
    };
    if (owner.address) headers['x-forwarded-for'] = owner.address;
    if (declareLength) headers['content-length'] = String(head.length + size + tail.length);
    const request = http.request(url, { method: 'POST', headers });
    const finish = (result: Omit<StreamResult, 'rssGrowthBytes'>) => {
      clearInterval(sampler);
      rssPeak = Math.max(rssPeak, rssBytes(pid));
      resolve({ ...result, rssGrowthBytes: rssPeak - rssBefore });
    };
    request.on('response', (response) => {
      answered = true;
      const parts: Buffer[] = [];
      response.on('data', (d: Buffer) => parts.push(d));
      response.on('end', () => {
        const text = Buffer.concat(parts).toString('utf8');
        let body: unknown = text;
        try {
          body = JSON.parse(text);
        } catch {
          /* not JSON: the assertion shows the text */
        }
        request.destroy();
        finish({ status: response.statusCode ?? 0, body, sentBytes });
      });
    });
    request.on('error', (error) => {
      // The server may close the connection after answering; only an error before any answer counts.
      if (!answered) {
        clearInterval(sampler);
        reject(error);
      }
    });
    (async () => {
      request.write(head);
      sentBytes += head.length;
      while (sentBytes - head.length < size && !answered && !request.destroyed) {
        const piece = chunk.subarray(0, Math.min(chunk.length, size - (sentBytes - head.length)));
        const flushed = request.write(piece);
        sentBytes += piece.length;
        if (!flushed) {
          await new Promise<void>((done) => {
            const check = setInterval(() => {
              if (answered || request.destroyed || request.writableNeedDrain === false) {
                clearInterval(check);
                done();
              }
            }, 5);
          });
        }
      }
      if (!answered && !request.destroyed) request.end(tail);
    })().catch((error) => {
      if (!answered) reject(error);
    });
  });
}

describe('a 50 MB file is refused early, whether its length is declared or it is chunked', () => {
  for (const route of ROUTES) {
    for (const declareLength of [true, false]) {
      it(`${route}: 50 MB ${declareLength ? 'with Content-Length' : 'chunked'} → 413 before it is sent in full, memory bounded`, async () => {
        const before = await state();
        const orphans = await orphanFiles(db);
        const started = Date.now();
        const res = await streamUpload(route, FIFTY_MB, declareLength);
        const mb = (n: number) => (n / 1024 / 1024).toFixed(1);
        console.log(
          `upload-abuse ${route} ${declareLength ? 'declared' : 'chunked'}: ${res.status} after ${mb(res.sentBytes)} MB sent of 50 MB, ` +
            `server RSS +${mb(res.rssGrowthBytes)} MB, ${Date.now() - started} ms`,
        );
        expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(413);
        expect(res.body.error).toMatch(LIMITS[route].label);
        expect(res.body.error).toMatch(/nothing was saved/);
        // Early: refused from the header alone, or once the limit (plus the form's 64 KiB headroom) is read.
        // The rest of the slack is what loopback socket buffers take in before the answer is read (common
        // practice, no source: Linux auto-tunes TCP buffers up to a few MB, tcp(7) tcp_rmem/tcp_wmem).
        const slack = 8 * 1024 * 1024;
        expect(res.sentBytes).toBeLessThan((declareLength ? 0 : LIMITS[route].bytes) + slack);
        expect(res.sentBytes).toBeLessThan(FIFTY_MB);
        // The server never held the whole file: it may hold up to the limit while it counts.
        expect(res.rssGrowthBytes).toBeLessThan(LIMITS[route].bytes + 32 * 1024 * 1024);
        expect(res.rssGrowthBytes).toBeLessThan(FIFTY_MB);
        expect(await state()).toEqual(before);
        expect(await orphanFiles(db)).toEqual(orphans);
        // The server still answers afterwards.
        expect((await owner.get(`/api/plots/${plotId}`)).status).toBe(200);
      }, 60_000);
    }
  }
});
