import Link from "next/link";
import { canRead } from "@/lib/auth/read-matrix";
import type { SiteRole } from "@/lib/core/vocabulary";

/**
 * "Trace this" on a record page: where its material went (the recall view), and for what was made or
 * shipped, what it is made of. Shown to the roles that may read traces.
 */
export function TraceThis({
  kind,
  code,
  role,
  back = false,
}: {
  kind: "SOURCE" | "PICKUP" | "LOT" | "TANK" | "BATCH" | "PRODUCT_LOT" | "SHIPMENT";
  code: string;
  role: SiteRole;
  back?: boolean;
}) {
  if (!canRead(role, "/trace")) return null;
  const c = encodeURIComponent(code);
  return (
    <p className="trace-this">
      {kind === "SHIPMENT" ? null : (
        <Link prefetch={false} href={`/trace/recall?kind=${kind}&code=${c}`}>
          Trace this: where it went
        </Link>
      )}
      {back ? (
        <>
          {kind === "SHIPMENT" ? null : " · "}
          <Link prefetch={false} href={`/trace?dir=back&kind=${kind}&code=${c}`}>
            {kind === "SHIPMENT" ? "Trace this: what it is made of" : "What it is made of"}
          </Link>
        </>
      ) : null}
    </p>
  );
}
