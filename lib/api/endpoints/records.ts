import { z } from "zod";
import type { EndpointDoc } from "@/lib/api/openapi";
import { SignInSchema } from "@/lib/auth/session.schema";
import { PickupSchema } from "@/lib/feedstock/pickup.schema";
import { TankSchema, TransferSchema } from "@/lib/tank/tank.schema";

/** Sign-in and record-keeping writes. Writes need an Idempotency-Key header. */
export const RECORD_ENDPOINTS: EndpointDoc[] = [
  {
    method: "post",
    path: "/api/session",
    tag: "Session",
    summary: "Sign in; sets the HttpOnly session cookie",
    input: SignInSchema,
  },
  {
    method: "get",
    path: "/api/me",
    tag: "Session",
    summary: "Who is signed in: login, name, role and site. Reads the session and nothing else. Any signed-in user.",
    output: z.object({ login: z.string(), fullName: z.string(), role: z.string(), siteId: z.number().int() }),
  },
  {
    method: "post",
    path: "/api/pickups",
    tag: "Records",
    summary: "Record one pickup (Idempotency-Key header required)",
    input: PickupSchema,
  },
  {
    method: "post",
    path: "/api/pickups/import",
    tag: "Records",
    summary: "Import pickups all-or-nothing; rows with a known idempotency key are skipped",
    input: z.object({ rows: z.array(PickupSchema) }),
  },
  {
    method: "post",
    path: "/api/transfers",
    tag: "Records",
    summary:
      "Move material into a tank: massKg, or volumeL read at tempC (converted with the source's density), or all: true; guarded against over-drawing and over-filling (Idempotency-Key header required)",
    input: TransferSchema,
  },
  {
    method: "post",
    path: "/api/tanks",
    tag: "Records",
    summary: "Register a tank (Idempotency-Key header required)",
    input: TankSchema,
  },
  {
    method: "get",
    path: "/api/holders/{kind}/{code}",
    tag: "Records",
    summary: "Book stock of a lot, tank, product lot or other holder, in grams",
  },
];
