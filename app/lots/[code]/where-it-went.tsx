import Link from "next/link";
import { labelOf } from "@/lib/core/vocabulary";
import type { FlowDestination, FlowMove, LotFlow } from "@/lib/feedstock/lot-detail.store";
import { kg, kgExact, when } from "@/app/_ui/format";
import { DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { Empty, HolderLink, Note } from "@/app/_ui/ui";
import { heldByKind } from "@/app/lots/[code]/where-it-is";
import type { HeldByKind } from "@/app/lots/[code]/where-it-is";

/** A time-ordered flow through a pooled tank reaches everything drawn from it later; show the first rows only. */
const MAX_PLACES = 60;

/** Grams of the lot held anywhere now, by kind of place; with what is left in the lot it adds up to what entered. */
function WhereItIsNow({ flow, lotCode }: { flow: LotFlow; lotCode: string }) {
  const { rows, totalG } = heldByKind(flow);
  const still: HeldByKind = { kind: "", places: 1, heldG: flow.stillInLotG };
  const columns: Array<Column<HeldByKind>> = [
    { key: "kind", header: "Kind of place", cell: (k) => (k.kind ? labelOf(k.kind) : `Still in lot ${lotCode}`) },
    { key: "places", header: "Places", numeric: true, cell: (k) => k.places, total: "" },
    { key: "held", header: "Of this lot", numeric: true, cell: (k) => kg(k.heldG), total: kg(totalG) },
  ];
  return (
    <>
      <h3>Where it is now</h3>
      <DataTable
        caption="Held now, by kind of place"
        hideCaption
        columns={columns}
        rows={[still, ...rows]}
        rowKey={(k) => k.kind}
        empty=""
      />
    </>
  );
}

function placeColumns(traced: boolean, timeZone: string): Array<Column<FlowDestination>> {
  return [
    { key: "place", header: "Place", cell: (d) => <HolderLink holder={d.holder} /> },
    { key: "first", header: "First reached", cell: (d) => <span className="nowrap">{when(d.firstAt, timeZone)}</span> },
    {
      key: "received",
      header: traced ? "Received from this lot" : "Moved in (whole movements)",
      numeric: true,
      cell: (d) => kg(d.receivedG),
    },
    ...(traced
      ? [
          {
            key: "held",
            header: "Still there",
            numeric: true,
            cell: (d: FlowDestination) => (d.heldG === null ? "—" : kg(d.heldG)),
          },
        ]
      : []),
  ];
}

function moveColumns(traced: boolean, timeZone: string): Array<Column<FlowMove>> {
  return [
    { key: "at", header: "When", cell: (m) => <span className="nowrap">{when(m.at, timeZone)}</span> },
    { key: "role", header: "Role", cell: (m) => labelOf(m.role) },
    { key: "from", header: "From", cell: (m) => <HolderLink holder={m.from} /> },
    { key: "to", header: "To", cell: (m) => <HolderLink holder={m.to} /> },
    { key: "grams", header: traced ? "Of this lot" : "Mass", numeric: true, cell: (m) => kgExact(m.grams) },
    ...(traced
      ? [{ key: "whole", header: "Whole movement", numeric: true, cell: (m: FlowMove) => kgExact(m.moveMassG) }]
      : []),
  ];
}

/** Why the list may not be the lot's own share: the ledger could not be replayed by date. */
function FlowBasis({ flow }: { flow: LotFlow }) {
  return (
    <>
      {flow.method !== "time-ordered" ? (
        <Note>
          Kilograms of this lot&apos;s material reaching each place, found by replaying the movement ledger: a tank
          mixes what it holds (or hands it on first in, first out where so set), so a batch drawn from a tank carries
          its share of every lot in it, and a batch&apos;s outputs carry the batch&apos;s shares.
          {flow.reversedPairsLeftOut > 0
            ? ` ${flow.reversedPairsLeftOut} reversed movements (booking corrections) are left out.`
            : ""}
        </Note>
      ) : (
        <p className="warning">
          The ledger could not be replayed ({flow.traceProblem}). Listed instead: every movement out of a place after
          material from this lot first arrived there. It may over-state where the lot went; masses are whole movements,
          not this lot&apos;s share.
        </p>
      )}
      {flow.method === "booking-order" ? (
        <p className="warning">
          Replayed in the order the movements were booked, not by their dates: by date, the books do not balance (
          {flow.traceProblem}). Book stock was checked in booking order, so this order gives consistent shares; the
          dates shown are the movements&apos; own.
        </p>
      ) : null}
    </>
  );
}

function PlacesAndMoves({ flow, lotCode, timeZone }: { flow: LotFlow; lotCode: string; timeZone: string }) {
  const traced = flow.method !== "time-ordered";
  const places = flow.destinations.slice(0, MAX_PLACES);
  return (
    <>
      {traced ? <WhereItIsNow flow={flow} lotCode={lotCode} /> : null}
      <h3>Places reached, in time order</h3>
      <DataTable
        caption="Places reached, in time order"
        hideCaption
        columns={placeColumns(traced, timeZone)}
        rows={places}
        rowKey={(d) => d.holder.id}
        empty=""
      />
      {places.length < flow.destinations.length ? (
        <Note>
          The first {places.length} of {flow.destinations.length} places are shown.
        </Note>
      ) : null}
      <h3>Movements that carried it</h3>
      <DataTable
        caption="Movements that carried it"
        hideCaption
        columns={moveColumns(traced, timeZone)}
        rows={flow.moves}
        rowKey={(m) => m.id}
        empty=""
      />
      {flow.moves.length < flow.movesTotal ? (
        <Note>
          The first {flow.moves.length} of {flow.movesTotal} movements are shown; the <Link href="/ledger">ledger</Link>{" "}
          has them all.
        </Note>
      ) : null}
    </>
  );
}

/** Where the lot's material went: its share in every place it reached, and the movements that carried it. */
export function WhereItWent({ flow, lotCode, timeZone }: { flow: LotFlow; lotCode: string; timeZone: string }) {
  const traced = flow.method !== "time-ordered";
  return (
    <section aria-labelledby="went-h">
      <h2 id="went-h">{traced ? "Where it went" : "Where it went: possible destinations (time-ordered flow)"}</h2>
      <FlowBasis flow={flow} />
      <p>
        Entered lot {lotCode}: <strong>{kg(flow.enteredG)}</strong>. Still in the lot:{" "}
        <strong>{kg(flow.stillInLotG)}</strong>.
      </p>
      {flow.destinations.length === 0 ? (
        <Empty>Nothing has left this lot yet.</Empty>
      ) : (
        <PlacesAndMoves flow={flow} lotCode={lotCode} timeZone={timeZone} />
      )}
    </section>
  );
}
