import { CodeLink } from "@/app/_ui/ui";
import type { FlagRow } from "@/lib/screening/screening.store";

const SHOWN = 6;

/** The pickups and lots a flag is about, as links; a long list is cut with a count of the rest. */
export function FlagLinks({ flag }: { flag: Pick<FlagRow, "pickupCodes" | "lotCodes"> }) {
  const links = [
    ...flag.lotCodes.map((c) => ({ key: `l-${c}`, href: `/lots/${encodeURIComponent(c)}`, code: c })),
    ...flag.pickupCodes.map((c) => ({ key: `p-${c}`, href: `/pickups/${encodeURIComponent(c)}`, code: c })),
  ];
  if (links.length === 0) return <span className="muted">—</span>;
  return (
    <span className="flag-links">
      {links.slice(0, SHOWN).map((l) => (
        <span key={l.key}>
          <CodeLink href={l.href} code={l.code} />{" "}
        </span>
      ))}
      {links.length > SHOWN ? <span className="muted">and {links.length - SHOWN} more</span> : null}
    </span>
  );
}
