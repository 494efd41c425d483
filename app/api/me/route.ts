import type { NextResponse } from "next/server";
import { requireReader } from "@/lib/auth/request.service";
import { respond } from "@/lib/api/json-route.service";
import { handled } from "@/lib/api/handle.service";

export const dynamic = "force-dynamic";

/** GET /api/me — who is signed in. Checks the session and does nothing else (the load run's floor). */
export const GET = handled("GET /api/me", async (request: Request): Promise<NextResponse> => {
  const who = await requireReader(request);
  if (!who.ok) return respond(who);
  const { login, fullName, role, siteId } = who.value;
  return respond({ ok: true, value: { login, fullName, role, siteId } });
});
