import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { getBatchDetail } from "@/lib/batch/batch.store";
import { listCautions, readPlannedFigures, suggestCharges } from "@/lib/batch/plan";
import { listOutputPlaces, listReagentStock } from "@/lib/batch/plan.store";
import { CATALYSTS } from "@/lib/ledger/kinds";
import type { Catalyst } from "@/lib/ledger/kinds";
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
    const initial: ChargeRow[] = suggested.rows.map((r) => ({ fromKind: r.fromKind, fromCode: r.fromCode, role: r.role, massKg: fixed(r.massKg) }));
    return (
      <>
        {back}
        <h1>Start batch {b.code}</h1>
        <p className="lede">
          Record what actually goes into the reactor. The rows are filled from the plan{planned?.basis === "legacy" ? " (its stored figures)" : ""} and the reagent lots in stock,
          oldest first: change them to what was weighed. Each draw is checked against what its lot, tank or reagent lot holds.
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

  if (b.status === "RUNNING") {
    const places = await listOutputPlaces(db, site.id);
    const chargedG = b.charges.reduce((s, m) => s + m.massG, 0);
    const firstOf = (kind: string, use: string) => places.find((p) => p.kind === kind && p.use === use)?.code ?? "";
    const suffix = b.code.replace(/^B-/, "");
    const initial: OutputRow[] = [
      { role: "ESTER", toKind: "PRODUCT_LOT", toCode: `P-${suffix}`, massKg: "" },
      { role: "GLYCEROL_PHASE", toKind: "WASTE_CONTAINER", toCode: firstOf("WASTE_CONTAINER", "GLYCEROL_PHASE"), massKg: "" },
      { role: "WASH_WATER", toKind: "WASTE_CONTAINER", toCode: firstOf("WASTE_CONTAINER", "WASH_WATER"), massKg: "" },
      { role: "RECOVERED_METHANOL", toKind: "TANK", toCode: firstOf("TANK", "METHANOL"), massKg: "" },
      { role: "LOSS", toKind: "", toCode: "", massKg: "" },
    ];
    return (
      <>
        {back}
        <h1>Finish batch {b.code}</h1>
        <p className="lede">
          Record what came out. Everything charged ({kg(chargedG, 3)}) must be accounted for as ester, glycerol phase, wash water, recovered methanol or a recorded loss.
        </p>
        {planned ? (
          <Note>
            Expected at full conversion: ester {num(planned.expectedEsterKg, 1)} kg, glycerol (pure) {num(planned.expectedGlycerolKg, 1)} kg; the glycerol phase also carries
            methanol, soap and catalyst.
          </Note>
        ) : null}
        <aside className="cautions" aria-label="Cautions">
          <p className="cautions-title">Cautions</p>
          <ul>
            {cautions
              .filter((c) => c.step === "GLYCEROL" || c.step === "METHANOL" || c.step === "HOT_OIL" || c.step === "GENERAL")
              .map((c) => (
                <li key={c.step}>{c.text}</li>
              ))}
          </ul>
        </aside>
        <FinishForm batchCode={b.code} chargedKg={chargedG / 1000} initial={initial} />
      </>
    );
  }

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
