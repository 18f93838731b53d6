import { NextResponse } from 'next/server';
import { ZodError, type ZodType } from 'zod';
import { crossSiteReason, STATE_CHANGING_METHODS } from './http-origin';
import { withApiSecurityHeaders } from './security-headers';
import { fieldErrors } from './validations/common';

/** A JSON body past this many bytes is refused while it streams in (nothing Sowcast takes is near it). */
export const JSON_BODY_LIMIT_BYTES = 1_000_000;
/** A body still arriving after this long is cut (a slow sender holds a connection and memory). */
export const BODY_TIMEOUT_MS = 30_000;

/** An error a route can show as it is: status plus a message for people. */
export class HttpError extends Error {
  constructor(
    public readonly status: number,
    message: string,
    public readonly fields?: Record<string, string>,
  ) {
    super(message);
  }
}

export const notFound = () => new HttpError(404, 'Not found');

function isDatabaseDown(error: unknown): boolean {
  const e = error as { code?: string; message?: string };
  return (
    ['ECONNREFUSED', 'ECONNRESET', '57P01', '57P03', 'ETIMEDOUT'].includes(e?.code ?? '') ||
    /timeout exceeded when trying to connect|Connection terminated/i.test(e?.message ?? '')
  );
}

export function errorResponse(error: unknown): NextResponse {
  if (error instanceof HttpError) {
    return NextResponse.json(
      { error: error.message, ...(error.fields ? { fields: error.fields } : {}) },
      { status: error.status },
    );
  }
  if (error instanceof ZodError) {
    const fields = fieldErrors(error);
    const first = Object.entries(fields)[0];
    return NextResponse.json(
      { error: first ? `${first[1]} (${first[0]})` : 'The request is not valid', fields, issues: error.issues },
      { status: 400 },
    );
  }
  if (isDatabaseDown(error)) {
    return NextResponse.json(
      { error: 'Sowcast cannot reach its database right now. Nothing was changed; try again shortly.' },
      { status: 503, headers: { 'Retry-After': '5' } },
    );
  }
  console.error(JSON.stringify({ level: 'error', msg: 'unhandled route error', error: String((error as Error)?.stack ?? error) }));
  return NextResponse.json({ error: 'Something went wrong on our side. Nothing was changed.' }, { status: 500 });
}

type Handler<C> = (request: Request, context: C) => Promise<Response>;

/**
 * Wraps a route handler: a state-changing request from another site's page is refused before the handler
 * runs (lib/http-origin.ts), every thrown error becomes a JSON answer with the right status, and every
 * answer carries the API's security headers (lib/security-headers.ts).
 */
export function route<C>(handler: Handler<C>): Handler<C> {
  return async (request, context) => {
    try {
      if (STATE_CHANGING_METHODS.has(request.method)) {
        const reason = crossSiteReason(request);
        if (reason) throw new HttpError(403, `Refused: ${reason}. Make this change from Sowcast's own pages.`);
      }
      return withApiSecurityHeaders(await handler(request, context));
    } catch (error) {
      return withApiSecurityHeaders(errorResponse(error));
    }
  };
}

const isJsonType = (type: string) => /^application\/([\w.+-]+\+)?json\s*(;|$)/i.test(type.trim());

/**
 * The body's bytes, refused with 413 as soon as they pass `limitBytes` (a declared Content-Length past it
 * is refused before reading) and with 408 when they are still arriving after `timeoutMs`.
 */
export async function readBodyWithin(request: Request, limitBytes: number, timeoutMs = BODY_TIMEOUT_MS): Promise<Uint8Array<ArrayBuffer>> {
  const tooLarge = () => new HttpError(413, `The request body is too large: over ${limitBytes / 1_000_000} MB`);
  const declared = Number(request.headers.get('content-length') ?? NaN);
  if (Number.isFinite(declared) && declared > limitBytes) throw tooLarge();
  if (!request.body) return new Uint8Array(0);
  const reader = request.body.getReader();
  let timer: NodeJS.Timeout | undefined;
  const timedOut = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new HttpError(408, `The request body did not arrive within ${timeoutMs / 1000} s`)), timeoutMs);
  });
  const chunks: Uint8Array[] = [];
  let total = 0;
  try {
    for (;;) {
      const { done, value } = await Promise.race([reader.read(), timedOut]);
      if (done) break;
      total += value.byteLength;
      if (total > limitBytes) throw tooLarge();
      chunks.push(value);
    }
  } catch (error) {
    // Not awaited: cancelling a stalled request stream can wait on the very bytes that never come.
    void reader.cancel().catch(() => undefined);
    throw error;
  } finally {
    clearTimeout(timer);
  }
  const body = new Uint8Array(total);
  let at = 0;
  for (const chunk of chunks) {
    body.set(chunk, at);
    at += chunk.byteLength;
  }
  return body;
}

/**
 * Reads a JSON object body: 415 unless it is sent as application/json (a form or text/plain post from
 * another page cannot pass for JSON), 413/408 past the size or time limit, 400 when it is not a JSON
 * object. No body at all reads as {}.
 */
export async function readJsonObject(request: Request): Promise<Record<string, unknown>> {
  const type = request.headers.get('content-type');
  const refuseType = () => new HttpError(415, 'Send the request body as JSON (Content-Type: application/json)');
  if (type !== null && !isJsonType(type)) throw refuseType();
  const bytes = await readBodyWithin(request, JSON_BODY_LIMIT_BYTES);
  if (bytes.byteLength === 0) return {};
  if (type === null) throw refuseType();
  let body: unknown;
  try {
    body = JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(bytes));
  } catch {
    throw new HttpError(400, 'The request body must be JSON');
  }
  if (body === null || typeof body !== 'object' || Array.isArray(body)) {
    throw new HttpError(400, 'The request body must be a JSON object');
  }
  return body as Record<string, unknown>;
}

/** Reads a JSON body and validates it with the entity's shared schema. */
export async function parseBody<T>(request: Request, schema: ZodType<T>): Promise<T> {
  return schema.parse(await readJsonObject(request));
}

/** For PATCH: the validated fields and the names of the fields the request actually sent. */
export async function parsePatch<T>(request: Request, schema: ZodType<T>): Promise<{ data: T; keys: string[] }> {
  const raw = await readJsonObject(request);
  const data = schema.parse(raw);
  const keys = Object.keys(raw);
  if (keys.length === 0) throw new HttpError(400, 'Nothing to change: send at least one field');
  return { data, keys };
}

export const json = (data: unknown, status = 200) => NextResponse.json(data, { status });
