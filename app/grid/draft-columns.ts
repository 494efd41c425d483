"use client";
// The draft grid's columns: headers in the user's units, read-only and computed columns marked, cells
// with a problem outlined (the message as tooltip) and the selected rectangle shaded.
import type { MutableRefObject } from "react";
import type { ColDef } from "ag-grid-community";
import type { UnitSystem } from "@/lib/quantity/units";
import type { GridTable } from "@/lib/grid/tables";
import { headerWithUnit } from "@/lib/grid/cells";
import { cellCount, contains, rangeOf } from "@/lib/grid/selection";
import type { DraftRow } from "@/lib/grid/drafts";
import { isSaved } from "@/lib/grid/drafts";
import type { Selection } from "@/app/grid/draft-commands";

export function draftColumnDefs(
  table: GridTable,
  system: UnitSystem,
  entry: ReadonlySet<string>,
  errorsRef: MutableRefObject<(r: DraftRow | undefined) => Record<string, string>>,
  sel: MutableRefObject<Selection | null>,
): ColDef<DraftRow>[] {
  return table.columns.map<ColDef<DraftRow>>((c, index) => ({
    colId: c.field,
    field: c.field,
    headerName: headerWithUnit(c, system),
    headerTooltip: c.computed
      ? `${c.header}: computed on the server after saving`
      : entry.has(c.field)
        ? undefined
        : `${c.header}: read-only`,
    width: c.width ?? 130,
    editable: (p) => !isSaved(p.data) && entry.has(c.field),
    type: c.kind === "number" || c.kind === "integer" ? "rightAligned" : undefined,
    tooltipValueGetter: (p) => errorsRef.current(p.data)[c.field],
    cellClassRules: {
      "cell-invalid": (p) => !!errorsRef.current(p.data)[c.field],
      "cell-computed": () => !entry.has(c.field),
      "cell-in-range": (p) => {
        const r = sel.current ? rangeOf(sel.current.anchor, sel.current.corner) : null;
        return !!r && cellCount(r) > 1 && p.node.rowIndex !== null && contains(r, { row: p.node.rowIndex, col: index });
      },
    },
  }));
}
