import { NextResponse } from 'next/server';
import { ZodError, type ZodType } from 'zod';
import { fieldErrors } from './validations/common';

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

/** Wraps a route handler: every thrown error becomes a JSON answer with the right status. */
export function route<C>(handler: Handler<C>): Handler<C> {
  return async (request, context) => {
    try {
      return await handler(request, context);
    } catch (error) {
      return errorResponse(error);
    }
  };
}

/** Reads a JSON object body; 400 when it is not JSON or not an object. */
export async function readJsonObject(request: Request): Promise<Record<string, unknown>> {
  let body: unknown;
  try {
    const text = await request.text();
    if (text.length > 1_000_000) throw new HttpError(413, 'The request body is too large');
    body = text ? JSON.parse(text) : {};
  } catch (error) {
    if (error instanceof HttpError) throw error;
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
