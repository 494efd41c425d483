"use client";
import Link from "next/link";
import type { PlainCell, PlainCellPart } from "@/app/_ui/kit/plain-cell";

function Part({ part }: { part: PlainCellPart }) {
  if (typeof part === "string") return part;
  if (part.href !== undefined)
    return (
      <Link prefetch={false} href={part.href} className={part.className} aria-label={part.label}>
        {part.text}
      </Link>
    );
  return (
    <span className={part.className} aria-label={part.label}>
      {part.text}
    </span>
  );
}

/**
 * A list's body rows drawn in the browser's own layer from plain values: the page sends each cell as a
 * string or a few small parts instead of a tree of elements, which on a fifty-row list was most of what
 * the server spent rendering the page. Links still move within the app without reloading it.
 */
export function PlainRows({
  rows,
  keys,
  numericColumns,
}: {
  rows: ReadonlyArray<{ key: string; cells: readonly PlainCell[] }>;
  keys: readonly string[];
  numericColumns: readonly number[];
}) {
  return (
    <tbody>
      {rows.map((r) => (
        <tr key={r.key}>
          {r.cells.map((cell, i) => (
            <td key={keys[i]} className={numericColumns.includes(i) ? "num" : undefined}>
              {typeof cell === "string" ? cell : cell.map((part, j) => <Part key={j} part={part} />)}
            </td>
          ))}
        </tr>
      ))}
    </tbody>
  );
}
