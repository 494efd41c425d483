import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { AuditEntry } from "@/lib/audit/audit.store";
import type { Db, Tx } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { labelOf } from "@/lib/core/vocabulary";
import { assertPeriodsOpen, createHolder, postMovement, requireHolder } from "@/lib/ledger/ledger.store";
import { reject, runInTransaction } from "@/lib/ledger/transaction.store";
import { requireDrawableHolder } from "@/lib/ledger/draw.store";
import { ChooseSpecSchema, ProductDecisionSchema, QcResultSchema, ShipmentSchema } from "@/lib/product/product.schema";
import type { ProductDecision, ProductDecisionValue } from "@/lib/product/product.schema";
import { judgeRecords, toResultsIn } from "@/lib/product/certificate";
import { currentResults, judgeValue } from "@/lib/spec/spec";
import type { Spec, Verdict } from "@/lib/spec/spec";
import { toGrams, toMillilitres } from "@/lib/quantity/units";
import type { Actor } from "@/lib/core/actor";
import { getSpecByKey } from "@/lib/spec/site-spec.service";
import {
  getProductState,
  insertQcResult,
  insertShipment,
  setProductDecision,
  setProductSpec,
} from "@/lib/product/product.store";
import type { ProductState } from "@/lib/product/product.store";

function shortSpecRef(spec: Spec): string {
  return spec.siteSpec ? `${spec.siteSpec.name} v${spec.siteSpec.version}` : `${spec.edition} ${spec.grade}`;
}

async function requireLot(tx: Tx, actor: Actor, code: string, field: string): Promise<ProductState> {
  const holder = await requireHolder(tx, actor.siteId, "PRODUCT_LOT", code, field);
  return getProductState(tx, holder.id);
}

async function requireLotSpec(tx: Tx, actor: Actor, lot: ProductState, code: string, field: string): Promise<Spec> {
  const spec = await getSpecByKey(tx, actor.siteId, lot.specKey);
  if (spec === null) reject("PRODUCT.NO_SPEC", `Product lot ${code} has no specification; choose one first`, field);
  return spec;
}

/**
 * Records one QC result, judged on entry against the lot's chosen specification: the unit, limits and
 * specification are stored with it as a snapshot, with the verdict at entry. A new result for a property
 * that already has one is a re-test: it supersedes the earlier one, which stays on record.
 */
export async function recordQcResult(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ id: number; verdict: Verdict; supersedesId: number | null; property: string }>> {
  const parsed = parseInput(QcResultSchema, input);
  if (!parsed.ok) return parsed;
  const q = parsed.value;
  return runInTransaction(db, async (tx) => {
    const lot = await requireLot(tx, actor, q.productLotCode, "productLotCode");
    if (lot.status !== "HELD")
      reject(
        "PRODUCT.DECIDED",
        `Product lot ${q.productLotCode} is ${labelOf(lot.status).toLowerCase()}; put it on hold before entering results`,
        "productLotCode",
      );
    const spec = await requireLotSpec(tx, actor, lot, q.productLotCode, "property");
    const p = spec.properties.find((x) => x.key === q.property);
    if (!p)
      reject("QC.UNKNOWN_PROPERTY", `Property: ${q.property} is not in ${spec.edition} ${spec.grade}`, "property");
    await assertPeriodsOpen(tx, actor.siteId, [{ at: q.testedAt, field: "testedAt" }]);
    const previous = currentResults(toResultsIn(lot.qc)).get(p.key);
    const verdict = judgeValue(p, q.value);
    const saved = await insertQcResult(tx, {
      productLotId: lot.id,
      property: p.key,
      method: q.method || p.method,
      value: q.value,
      unit: p.unit,
      limitMin: p.min ?? null,
      limitMax: p.max ?? p.classMax ?? null,
      specRef: shortSpecRef(spec),
      verdict,
      pass: verdict !== "FAIL",
      lab: q.lab,
      reportNo: q.reportNo,
      testedAt: q.testedAt,
      supersedesId: previous?.id ?? null,
      recordedById: actor.userId,
      recordedAt: actor.now,
    });
    await appendAudit(tx, actor, {
      action: "CREATE",
      entity: "QcResult",
      entityKey: q.productLotCode,
      after: {
        ...q,
        method: q.method || p.method,
        unit: p.unit,
        specKey: spec.key,
        verdict,
        supersedesId: previous?.id ?? null,
      },
    });
    return { id: saved.id, verdict, supersedesId: previous?.id ?? null, property: p.label };
  });
}

/** Chooses the specification a held lot is judged against. Results already entered are judged afresh against it. */
export async function chooseProductSpec(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ code: string; specKey: string; releasable: boolean }>> {
  const parsed = parseInput(ChooseSpecSchema, input);
  if (!parsed.ok) return parsed;
  const c = parsed.value;
  return runInTransaction(db, async (tx) => {
    const lot = await requireLot(tx, actor, c.productLotCode, "productLotCode");
    if (lot.status !== "HELD")
      reject(
        "PRODUCT.DECIDED",
        `Product lot ${c.productLotCode} is ${labelOf(lot.status).toLowerCase()}; put it on hold before changing its specification`,
        "specKey",
      );
    const spec = await getSpecByKey(tx, actor.siteId, c.specKey);
    if (spec === null)
      reject(
        "PRODUCT.UNKNOWN_SPEC",
        `Specification: ${c.specKey} is not a known edition and grade or site specification`,
        "specKey",
      );
    await setProductSpec(tx, lot.id, spec.key);
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "ProductLot",
      entityKey: c.productLotCode,
      before: { specKey: lot.specKey },
      after: { specKey: spec.key },
    });
    return { code: c.productLotCode, specKey: spec.key, releasable: judgeRecords(spec, lot.qc).releasable };
  });
}

const AUDIT_ACTION: Record<ProductDecision, AuditEntry["action"]> = {
  RELEASE: "RELEASE",
  RELEASE_WITH_DEVIATION: "RELEASE",
  HOLD: "CHANGE",
  REJECT: "REJECT",
};

/** Why a lot cannot be released as it stands, in the plant's words. */
function notReleasableText(spec: Spec, missing: readonly string[], failing: readonly string[]): string {
  const label = (k: string) =>
    spec.properties.find((p) => p.key === k)?.label.toLowerCase() ??
    spec.rules.find((r) => r.key === k)?.label.toLowerCase() ??
    k;
  const parts = [
    failing.length ? `out of limits: ${failing.map(label).join(", ")}` : "",
    missing.length ? `missing: ${missing.map(label).join(", ")}` : "",
  ].filter(Boolean);
  return `Cannot release against ${spec.edition} ${spec.grade}; ${parts.join("; ")}. Release with a deviation needs a reason.`;
}

/**
 * Release, release with a deviation, hold or reject (compliance only, checked by the caller). Release is
 * judged afresh against the lot's current specification, not from the verdicts stored at entry: every
 * required property present and passing and every either-or rule met. A deviation release, a hold and a
 * rejection need a reason, which is stored, audited and printed on the certificate.
 */
export async function decideProductLot(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ code: string; status: string; deviation: boolean }>> {
  const parsed = parseInput(ProductDecisionSchema, input);
  if (!parsed.ok) return parsed;
  return runInTransaction(db, (tx) => applyProductDecision(tx, actor, parsed.value));
}

/** One decision inside the caller's transaction (a recall holds many lots at once, all or none). */
export async function applyProductDecision(
  tx: Tx,
  actor: Actor,
  d: ProductDecisionValue,
): Promise<{ code: string; status: string; deviation: boolean }> {
  const lot = await requireLot(tx, actor, d.productLotCode, "productLotCode");
  const allowedFrom = d.decision === "HOLD" ? ["HELD", "RELEASED"] : ["HELD"];
  if (!allowedFrom.includes(lot.status))
    reject(
      "PRODUCT.DECIDED",
      `Product lot ${d.productLotCode} is already ${labelOf(lot.status).toLowerCase()}`,
      "decision",
    );
  let deviation = false;
  let judged: { missing: string[]; failing: string[] } | null = null;
  if (d.decision === "RELEASE" || d.decision === "RELEASE_WITH_DEVIATION") {
    const spec = await requireLotSpec(tx, actor, lot, d.productLotCode, "decision");
    const j = judgeRecords(spec, lot.qc);
    judged = { missing: j.missing, failing: j.failing };
    if (d.decision === "RELEASE" && !j.releasable)
      reject("PRODUCT.NOT_RELEASABLE", notReleasableText(spec, j.missing, j.failing), "decision");
    if (d.decision === "RELEASE_WITH_DEVIATION" && j.releasable)
      reject("PRODUCT.NO_DEVIATION", "Every result conforms; release it without a deviation", "decision");
    deviation = d.decision === "RELEASE_WITH_DEVIATION";
  }
  const status = d.decision === "HOLD" ? "HELD" : d.decision === "REJECT" ? "REJECTED" : "RELEASED";
  await setProductDecision(tx, lot.id, {
    status,
    releasedAt: status === "RELEASED" ? actor.now : null,
    decisionReason: d.reason,
    deviation,
    decidedAt: actor.now,
    decidedById: actor.userId,
  });
  await appendAudit(tx, actor, {
    action: AUDIT_ACTION[d.decision],
    entity: "ProductLot",
    entityKey: d.productLotCode,
    before: { status: lot.status, deviation: lot.deviation, reason: lot.decisionReason },
    after: { status, deviation, reason: d.reason, specKey: lot.specKey, ...(judged ?? {}) },
  });
  return { code: d.productLotCode, status, deviation };
}

/** Only released product leaves the site; a product tank is assumed to hold released product only. */
export async function shipProduct(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ id: number; documentNo: string }>> {
  const parsed = parseInput(ShipmentSchema, input);
  if (!parsed.ok) return parsed;
  const s = parsed.value;
  return runInTransaction(db, async (tx) => {
    const from = await requireDrawableHolder(tx, actor.siteId, s.fromKind, s.fromCode, "fromCode");
    if (s.fromKind === "PRODUCT_LOT") {
      const p = await getProductState(tx, from);
      if (p.status !== "RELEASED")
        reject("PRODUCT.NOT_RELEASED", `Product lot ${s.fromCode} is not released`, "fromCode");
    }
    const holderId = await createHolder(tx, actor.siteId, "SHIPMENT", s.documentNo);
    const massG = toGrams(s.massKg);
    const shipment = await insertShipment(tx, {
      siteId: actor.siteId,
      holderId,
      documentNo: s.documentNo,
      customer: s.customer,
      shippedAt: s.shippedAt,
      massG,
      volumeMl: toMillilitres(s.volumeL),
      certifiedClaim: s.certifiedClaim,
    });
    await postMovement(tx, {
      siteId: actor.siteId,
      at: s.shippedAt,
      role: "SHIPMENT",
      fromHolderId: from,
      toHolderId: holderId,
      massG,
      volumeMl: toMillilitres(s.volumeL),
      note: s.note,
      recordedById: actor.userId,
    });
    await appendAudit(tx, actor, {
      action: "CREATE",
      entity: "Shipment",
      entityKey: s.documentNo,
      after: { ...s, massG },
    });
    return shipment;
  });
}
