import "server-only";
import { NextResponse } from "next/server";
import type { z } from "zod";
import type { Result } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { statusFor } from "@/lib/http";
import { createHash } from "node:crypto";
import { withIdempotencyKey } from "@/lib/ledger/transaction.store";

/** JSON body for a Result: 200 `{ok:true,value}` or the mapped status with `{ok:false,issues}`. */
export function respond<T>(result: Result<T>): NextResponse {
  if (result.ok) return NextResponse.json({ ok: true, value: result.value });
  const status = statusFor(result.issues);
  // 503 is a database fault that cleared nothing: tell the client when to send the same request again.
  const headers: Record<string, string> = status === 503 ? { "retry-after": "2" } : {};
  return NextResponse.json({ ok: false, issues: result.issues }, { status, headers });
}

/**
 * CSRF defence for route handlers that change data: the browser's Origin (or, without it,
 * Sec-Fetch-Site) must say the request comes from this app. Server actions get Next's own check.
 */
export function requireSameOrigin(request: Request): Result<true> {
  const origin = request.headers.get("origin");
  const host = request.headers.get("x-forwarded-host") ?? request.headers.get("host");
  if (origin !== null) {
    try {
      if (new URL(origin).host === host) return { ok: true, value: true };
    } catch {
      /* falls through to the refusal */
    }
    return {
      ok: false,
      issues: [{ code: "AUTH.CROSS_SITE", message: "Refused: the request did not come from this application" }],
    };
  }
  const site = request.headers.get("sec-fetch-site");
  if (site === "cross-site" || site === "same-site")
    return {
      ok: false,
      issues: [{ code: "AUTH.CROSS_SITE", message: "Refused: the request did not come from this application" }],
    };
  return { ok: true, value: true };
}

/** The largest JSON body a route reads unless it names its own limit (imports do). */
export const MAX_JSON_BYTES = 1_000_000;

/** Bulk writes (a pickup import of up to 5,000 rows, a pasted grid block) read up to this much. */
export const MAX_BULK_JSON_BYTES = 5_000_000;

export function describeBytes(bytes: number): string {
  return bytes >= 1_000_000 ? `${bytes / 1_000_000} MB` : `${bytes / 1_000} kB`;
}

function tooLarge(limit: number): Result<never> {
  return {
    ok: false,
    issues: [{ code: "INPUT.TOO_LARGE", message: `The request is larger than ${describeBytes(limit)}` }],
  };
}

/** The body as text, or null once it passes `limit` bytes (the rest is not read). */
async function readLimited(request: Request, limit: number): Promise<string | null> {
  if (request.body === null) return "";
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      await reader.cancel();
      return null;
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks).toString("utf8");
}

/** Reads a JSON body: over the limit is a 413 that names it, a body that is not JSON a 422 — never a 500. */
export async function readJson(request: Request, limit = MAX_JSON_BYTES): Promise<Result<unknown>> {
  const declared = Number(request.headers.get("content-length") ?? "");
  if (Number.isFinite(declared) && declared > limit) return tooLarge(limit);
  let text: string | null;
  try {
    text = await readLimited(request, limit);
  } catch {
    return { ok: false, issues: [{ code: "INPUT.NOT_JSON", message: "The request body could not be read" }] };
  }
  if (text === null) return tooLarge(limit);
  try {
    return { ok: true, value: JSON.parse(text) as unknown };
  } catch {
    return { ok: false, issues: [{ code: "INPUT.NOT_JSON", message: "The request body must be JSON" }] };
  }
}

export async function parseBody<S extends z.ZodType>(
  request: Request,
  schema: S,
  limit = MAX_JSON_BYTES,
): Promise<Result<z.output<S>>> {
  const body = await readJson(request, limit);
  return body.ok ? parseInput(schema, body.value) : body;
}

export function parseQuery<S extends z.ZodType>(request: Request, schema: S): Result<z.output<S>> {
  return parseInput(schema, Object.fromEntries(new URL(request.url).searchParams));
}

const KEY_PATTERN = /^[A-Za-z0-9_-]{8,100}$/;

/**
 * Runs a client's write under its Idempotency-Key header (required on data-changing API calls):
 * the key and the first answer are stored with the change; a retry gets the same answer.
 */
export async function idempotent<T>(
  request: Request,
  userId: number,
  body: unknown,
  fn: () => Promise<Result<T>>,
): Promise<Result<T>> {
  const key = request.headers.get("idempotency-key");
  if (!key)
    return {
      ok: false,
      issues: [
        {
          code: "IDEMPOTENCY.KEY_REQUIRED",
          message: "Send an Idempotency-Key header (for example a UUID) with every write",
          field: "Idempotency-Key",
        },
      ],
    };
  if (!KEY_PATTERN.test(key))
    return {
      ok: false,
      issues: [
        {
          code: "IDEMPOTENCY.KEY_INVALID",
          message: "Idempotency-Key: 8–100 letters, digits, - or _",
          field: "Idempotency-Key",
        },
      ],
    };
  const requestHash = createHash("sha256")
    .update(JSON.stringify(body ?? null))
    .digest("hex");
  return withIdempotencyKey({ userId, key, requestHash }, fn);
}
