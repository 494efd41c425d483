import type { Metadata } from "next";
import type { ReactNode } from "react";
import Link from "next/link";
import { notFound } from "next/navigation";
import { getBatchDetail } from "@/lib/batch/batch.store";
import type { BatchDetail } from "@/lib/batch/batch.store";
import { listCautions, readPlannedFigures, suggestCharges } from "@/lib/batch/plan";
import type { Caution, PlannedFigures } from "@/lib/batch/plan";
import { listOutputPlaces, listReagentStock } from "@/lib/batch/plan.store";
import { CATALYSTS } from "@/lib/core/vocabulary";
import { getSiteLimits } from "@/lib/mass-balance/site-limits.service";
import type { Catalyst } from "@/lib/core/vocabulary";
import { kg, num } from "@/app/_ui/format";
import { codeParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { NoSite, Note, Status } from "@/app/_ui/ui";
import { FinishForm, StartForm } from "@/app/batches/[code]/record/rows-form";
import type { ChargeRow, OutputRow } from "@/app/batches/[code]/record/rows-form";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ code: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Record batch ${codeParam((await params).code)}` };
}

function fixed(kgValue: number): string {
  return num(kgValue, 3);
}

/** The finish: measured outputs only; the remainder is booked as the unmeasured difference. */
async function FinishView({
  db,
  siteId,
  b,
  planned,
  cautions,
  back,
}: {
  db: Awaited<ReturnType<typeof loadSite>>["db"];
  siteId: number;
  b: BatchDetail;
  planned: PlannedFigures | null;
  cautions: Caution[];
  back: ReactNode;
}) {
  const [places, reagents] = await Promise.all([listOutputPlaces(db, siteId), listReagentStock(db, siteId)]);
  const chargedG = b.charges.reduce((s, m) => s + m.massG, 0);
  const firstOf = (kind: string, use: string) => places.find((p) => p.kind === kind && p.use === use)?.code ?? "";
  const suffix = b.code.replace(/^B-/, "");
  const waterKg = planned && planned.washWaterKg > 0 ? planned.washWaterKg : 0;
  const waterLot = reagents
    .filter((r) => r.reagent === "WATER" && r.stockG >= waterKg * 1000 && r.stockG > 0)
    .sort((a, c) => a.receivedAt.getTime() - c.receivedAt.getTime() || a.code.localeCompare(c.code))[0];
  const tolerance = (await getSiteLimits(db, siteId)).closure;
  const initial: OutputRow[] = [
    { role: "ESTER", toKind: "PRODUCT_LOT", toCode: `P-${suffix}`, massKg: "" },
    {
      role: "GLYCEROL_PHASE",
      toKind: "WASTE_CONTAINER",
      toCode: firstOf("WASTE_CONTAINER", "GLYCEROL_PHASE"),
      massKg: "",
    },
    {
      role: "WASH_WATER",
      toKind: "WASTE_CONTAINER",
      toCode: firstOf("WASTE_CONTAINER", "WASH_WATER"),
      massKg: "",
      waterFromCode: waterKg > 0 ? (waterLot?.code ?? "") : "",
      waterKg: waterKg > 0 ? fixed(waterKg) : "",
    },
    { role: "RECOVERED_METHANOL", toKind: "TANK", toCode: firstOf("TANK", "METHANOL"), massKg: "" },
    { role: "LOSS", toKind: "", toCode: "", massKg: "", reason: "" },
  ];
  return (
    <>
      {back}
      <h1>Finish batch {b.code}</h1>
      <p className="lede">
        Record what you weighed or gauged out of the {kg(chargedG, 3)} charged. Whatever no measurement finds is booked
        for you as the batch&apos;s unmeasured difference and flagged when it is above the site&apos;s tolerance — do
        not type it as a loss. Record a loss only for something that really happened (a spill, a leak) and say what.
        Water used for washing comes from a water lot and goes with the wash water; it is never part of the product.
      </p>
      {planned ? (
        <Note>
          Expected at full conversion: ester {num(planned.expectedEsterKg, 1)} kg, glycerol (pure){" "}
          {num(planned.expectedGlycerolKg, 1)} kg; the glycerol phase also carries methanol, soap and catalyst.
        </Note>
      ) : null}
      <aside className="cautions" aria-label="Cautions">
        <p className="cautions-title">Cautions</p>
        <ul>
          {cautions
            .filter(
              (c) => c.step === "GLYCEROL" || c.step === "METHANOL" || c.step === "HOT_OIL" || c.step === "GENERAL",
            )
            .map((c) => (
              <li key={c.step}>{c.text}</li>
            ))}
        </ul>
      </aside>
      <FinishForm batchCode={b.code} chargedKg={chargedG / 1000} warnPct={tolerance.warnPct} initial={initial} />
      <Note>
        Closure tolerance: warn above {num(tolerance.warnPct, 2)} %, fail above {num(tolerance.failPct, 2)} % of the
        charge ({tolerance.source}).
      </Note>
    </>
  );
}

export default async function RecordBatchPage({ params }: Props) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const b = await getBatchDetail(db, site.id, codeParam((await params).code));
  if (!b) notFound();
  const planned = readPlannedFigures(b);
  const canWrite = user.role === "PRODUCTION";
  const catalyst: Catalyst = (CATALYSTS as readonly string[]).includes(b.catalyst) ? (b.catalyst as Catalyst) : "KOH";
  const cautions = listCautions({ catalyst, acidStep: b.pretreated });
  const back = (
    <p className="crumbs">
      <Link href="/batches">Batches</Link> / <Link href={`/batches/${encodeURIComponent(b.code)}`}>{b.code}</Link> /
    </p>
  );
  if (!canWrite) {
    return (
      <>
        {back}
        <h1>Record batch {b.code}</h1>
        <Note>Only production staff record the start and finish of a batch.</Note>
      </>
    );
  }

  if (b.status === "PLANNED") {
    const reagents = await listReagentStock(db, site.id);
    const suggested = planned ? suggestCharges(planned, reagents) : { rows: [], notices: [] };
    const initial: ChargeRow[] = suggested.rows.map((r) => ({
      fromKind: r.fromKind,
      fromCode: r.fromCode,
      role: r.role,
      massKg: fixed(r.massKg),
    }));
    return (
      <>
        {back}
        <h1>Start batch {b.code}</h1>
        <p className="lede">
          Record what actually goes into the reactor. The rows are filled from the plan
          {planned?.basis === "legacy" ? " (its stored figures)" : ""} and the reagent lots in stock, oldest first:
          change them to what was weighed. Each draw is checked against what its lot, tank or reagent lot holds.
        </p>
        {suggested.notices.map((s) => (
          <p key={s} className="warning">
            {s}
          </p>
        ))}
        <aside className="cautions" aria-label="Cautions">
          <p className="cautions-title">Cautions</p>
          <ul>
            {cautions
              .filter((c) => c.step !== "GLYCEROL")
              .map((c) => (
                <li key={c.step}>{c.text}</li>
              ))}
          </ul>
        </aside>
        <StartForm batchCode={b.code} initial={initial} />
      </>
    );
  }

  if (b.status === "RUNNING")
    return <FinishView db={db} siteId={site.id} b={b} planned={planned} cautions={cautions} back={back} />;

  return (
    <>
      {back}
      <h1>Batch {b.code}</h1>
      <p>
        This batch is <Status code={b.status} />; there is nothing more to record.
      </p>
    </>
  );
}
