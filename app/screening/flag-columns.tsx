import Link from "next/link";
import type { FlagRow } from "@/lib/screening/screening.store";
import { SIGNAL_LABELS } from "@/lib/screening/screening";
import type { Signal } from "@/lib/screening/screening";
import { day, when } from "@/app/_ui/format";
import { StatusMark } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { FlagLinks } from "@/app/screening/flag-links";

/** The decision's reason and the lots it held, in one line. */
function reasonText(f: FlagRow): string {
  return (
    [f.reason, f.heldLots.length > 0 ? `lots held: ${f.heldLots.join(", ")}` : ""].filter(Boolean).join("; ") || "—"
  );
}

/** The columns a list of source-check flags may show, by key; each list picks those it needs, in its order. */
export function flagColumns(tz: string) {
  return {
    raised: { key: "raised", header: "Raised", cell: (f) => <span className="nowrap">{day(f.raisedAt, tz)}</span> },
    source: {
      key: "source",
      header: "Source",
      cell: (f) => <Link href={`/sources/${encodeURIComponent(f.sourceCode)}`}>{f.sourceCode}</Link>,
    },
    check: { key: "check", header: "Check", cell: (f) => SIGNAL_LABELS[f.signal as Signal] ?? f.signal },
    found: { key: "found", header: "What was found", cell: (f) => f.message },
    records: { key: "records", header: "Pickups and lots", cell: (f) => <FlagLinks flag={f} /> },
    state: { key: "state", header: "Decision", cell: (f) => <StatusMark code={`FLAG_${f.status}`} /> },
    decidedAt: {
      key: "decided",
      header: "Decided",
      cell: (f) => <span className="nowrap">{when(f.decidedAt, tz)}</span>,
    },
    decidedWhenBy: {
      key: "decided",
      header: "Decided",
      cell: (f) => (f.decidedAt ? `${when(f.decidedAt, tz)}${f.decidedBy ? `, ${f.decidedBy}` : ""}` : "—"),
    },
    by: { key: "by", header: "By", cell: (f) => f.decidedBy ?? "—" },
    reason: { key: "reason", header: "Reason", cell: reasonText },
  } satisfies Record<string, Column<FlagRow>>;
}
