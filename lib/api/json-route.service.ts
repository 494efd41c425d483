import "server-only";
import { NextResponse } from "next/server";
import type { z } from "zod";
import type { Result } from "@/lib/errors";
import { parseInput } from "@/lib/ledger/parse";
import { statusFor } from "@/lib/http";

/** JSON body for a Result: 200 `{ok:true,value}` or the mapped status with `{ok:false,issues}`. */
export function respond<T>(result: Result<T>): NextResponse {
  return result.ok ? NextResponse.json({ ok: true, value: result.value }) : NextResponse.json({ ok: false, issues: result.issues }, { status: statusFor(result.issues) });
}

/** Reads a JSON body; a body that is not JSON is a 422 that says so, never a 500. */
export async function readJson(request: Request): Promise<Result<unknown>> {
  try {
    return { ok: true, value: await request.json() };
  } catch {
    return { ok: false, issues: [{ code: "INPUT.NOT_JSON", message: "The request body must be JSON" }] };
  }
}

export async function parseBody<S extends z.ZodType>(request: Request, schema: S): Promise<Result<z.output<S>>> {
  const body = await readJson(request);
  return body.ok ? parseInput(schema, body.value) : body;
}

export function parseQuery<S extends z.ZodType>(request: Request, schema: S): Result<z.output<S>> {
  return parseInput(schema, Object.fromEntries(new URL(request.url).searchParams));
}
