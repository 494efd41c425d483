import { when } from "@/app/_ui/format";
import type { Column } from "@/app/_ui/kit";

/** What every list of hauls shows first: the manifest, when it was collected, by whom, and where it went. */
export interface Haul {
  documentNo: string;
  disposedAt: Date;
  hauler: string;
  destination: string;
}

/** The leading columns of a list of hauls, the same on the waste page and on a container's page. */
export function haulColumns<T extends Haul>(timeZone: string): Array<Column<T>> {
  return [
    { key: "doc", header: "Manifest or document", cell: (d) => d.documentNo },
    { key: "at", header: "Collected", cell: (d) => when(d.disposedAt, timeZone) },
    { key: "hauler", header: "Hauler", cell: (d) => d.hauler },
    {
      key: "dest",
      header: "Destination facility",
      cell: (d) => d.destination || <span className="muted">not recorded</span>,
    },
  ];
}
