import type { NextResponse } from "next/server";
import { getDb } from "@/lib/core/db";
import { respond } from "@/lib/api/json-route.service";
import { requireReader } from "@/lib/auth/request.service";
import { HOLDER_KINDS } from "@/lib/core/vocabulary";
import { getHolderStock } from "@/lib/ledger/movement.store";
import { handled } from "@/lib/api/handle.service";

/** Book stock of one holder (lot, tank, product lot, …) in grams. */
export const GET = handled(
  "GET /api/holders/[kind]/[code]",
  async (request: Request, context: { params: Promise<{ kind: string; code: string }> }): Promise<NextResponse> => {
    const who = await requireReader(request);
    if (!who.ok) return respond(who);
    const { kind, code } = await context.params;
    const k = kind.toUpperCase();
    if (!(HOLDER_KINDS as readonly string[]).includes(k))
      return respond({
        ok: false,
        issues: [{ code: "INPUT.INVALID", message: `kind must be one of: ${HOLDER_KINDS.join(", ")}`, field: "kind" }],
      });
    const stock = await getHolderStock(await getDb(), who.value.siteId, k, decodeURIComponent(code).toUpperCase());
    return respond(
      stock
        ? { ok: true, value: stock }
        : {
            ok: false,
            issues: [{ code: "RECORD.NOT_FOUND", message: `No ${k.toLowerCase()} ${code}`, field: "code" }],
          },
    );
  },
);
