import Link from "next/link";
import type { ReactNode } from "react";
import { StatusMark } from "@/app/_ui/kit/status-mark";
import { Facts } from "@/app/_ui/ui";

/** The top of every record page: what it is, its number, its state, the key facts and what can be done. */
export function RecordHeader({
  kind,
  number,
  name,
  status,
  facts = [],
  actions,
  back,
}: {
  kind: string;
  number: string;
  /** The record's own name, after its number (a source's or a tank's name). */
  name?: string;
  status?: { code: string; label?: string };
  facts?: ReadonlyArray<readonly [string, ReactNode]>;
  actions?: ReactNode;
  back?: { href: string; label: string };
}) {
  return (
    <header className="record-header">
      {back ? (
        <p className="crumbs">
          <Link href={back.href}>{back.label}</Link>
        </p>
      ) : null}
      <h1>
        <span className="record-kind">{kind}</span> <span className="code">{number}</span>
        {name ? `: ${name}` : null} {status ? <StatusMark code={status.code} label={status.label} /> : null}
      </h1>
      {facts.length > 0 ? <Facts items={facts} /> : null}
      {actions ? <div className="record-actions">{actions}</div> : null}
    </header>
  );
}
