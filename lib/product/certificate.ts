// Builds the certificate of analysis of a product lot as data (pure: the clock comes in as generatedAt).
// The product lot page's QC table and the PDF both render what this returns, so the numbers, limits
// and verdicts on screen and on paper are the same, judged afresh against the lot's current specification.
import { judgeLot } from "@/lib/spec/spec";
import type { LotJudgement, PropertyJudgement, ResultIn, Spec } from "@/lib/spec/spec";
import type { CertificateData, CertificateRow, CertificateVerdict } from "@/lib/product/certificate-data";

export type { CertificateData, CertificateRow, CertificateVerdict } from "@/lib/product/certificate-data";

/** One stored QC result as the builder needs it. */
export interface QcRecord {
  id: number;
  property: string;
  value: number;
  method: string;
  lab: string;
  reportNo: string;
  testedAt: Date;
  /** The earlier result of the same property this re-test replaced. */
  supersedesId: number | null;
}

export interface CertificateInput {
  plant: { name: string; town: string };
  timeZone: string;
  lot: {
    code: string;
    batchCode: string | null;
    producedAt: Date;
    massG: number;
    status: string;
    deviation: boolean;
    decisionReason: string;
    decidedAt: Date | null;
    decidedBy: string | null;
  };
  spec: Spec;
  results: readonly QcRecord[];
  generatedAt: Date;
}

const VERDICT_TEXT: Record<CertificateVerdict, string> = {
  PASS: "Pass",
  FAIL: "Fail",
  REPORTED: "Reported",
  NOT_JUDGED: "Not judged",
  MISSING: "Missing",
};

/** A result as the lab would write it: up to six significant figures, no trailing zeros, no exponent. */
export function formatResult(value: number): string {
  const n = Number(value.toPrecision(6));
  if (Math.abs(n) >= 1e-6 || n === 0) return String(n);
  return n.toFixed(12).replace(/0+$/, "");
}

/** The specification in one line: edition and grade with its title, or the site specification and what it is based on. */
export function specText(spec: Spec): string {
  const base = `${spec.edition} ${spec.grade}`;
  if (spec.siteSpec)
    return `${spec.siteSpec.name}, version ${spec.siteSpec.version} (site specification based on ${base})`;
  return `${base}: ${spec.title}`;
}

export function toResultsIn(results: readonly QcRecord[]): ResultIn[] {
  return results.map((r) => ({
    id: r.id,
    property: r.property,
    value: r.value,
    testedAt: r.testedAt,
    supersedes: r.supersedesId,
  }));
}

/** The unit has its own column: "≤ 0.50 mg KOH/g" → "≤ 0.50". */
function withoutUnit(limit: string, unit: string): string {
  return unit !== "" && limit.endsWith(` ${unit}`) ? limit.slice(0, -unit.length - 1) : limit;
}

function verdictText(j: PropertyJudgement): string {
  if (j.result === null && j.verdict === "NOT_JUDGED") return "Not tested";
  return VERDICT_TEXT[j.verdict];
}

function row(j: PropertyJudgement, byId: ReadonlyMap<number, QcRecord>): CertificateRow {
  const p = j.property;
  const rec = j.result ? byId.get(j.result.id) : undefined;
  const result =
    j.result === null
      ? ""
      : p.kind === "class"
        ? `${p.classScale ?? "Class"} ${formatResult(j.result.value)}`
        : formatResult(j.result.value);
  return {
    key: p.key,
    property: p.label,
    method: rec?.method || p.method,
    limit: withoutUnit(j.limitText, p.unit),
    result,
    unit: p.unit,
    verdict: j.verdict,
    verdictText: verdictText(j),
    required: p.required,
    testedAt: j.result?.testedAt ?? null,
    lab: rec?.lab ?? "",
    reportNo: rec?.reportNo ?? "",
  };
}

function labelsOf(spec: Spec, keys: readonly string[]): string[] {
  return keys.map(
    (k) => spec.properties.find((p) => p.key === k)?.label ?? spec.rules.find((r) => r.key === k)?.label ?? k,
  );
}

function decisionStatus(status: string): CertificateData["decision"]["status"] {
  return status === "RELEASED" || status === "REJECTED" ? status : "HELD";
}

function decisionText(status: CertificateData["decision"]["status"], deviation: boolean): string {
  if (status === "RELEASED") return deviation ? "Released with a deviation" : "Released";
  return status === "REJECTED" ? "Rejected" : "On hold";
}

/** The judgement of the lot's results against its specification (the one release itself uses). */
export function judgeRecords(spec: Spec, results: readonly QcRecord[]): LotJudgement {
  return judgeLot(spec, toResultsIn(results));
}

export function buildCertificate(input: CertificateInput): CertificateData {
  const { spec, lot } = input;
  const judgement = judgeRecords(spec, input.results);
  const byId = new Map(input.results.map((r) => [r.id, r]));
  const status = decisionStatus(lot.status);
  return {
    plant: input.plant,
    lot: { code: lot.code, batchCode: lot.batchCode, producedAt: lot.producedAt, massKg: lot.massG / 1000 },
    specText: specText(spec),
    rows: judgement.properties.map((j) => row(j, byId)),
    rules: judgement.rules.map((r) => ({
      label: r.rule.label,
      met: r.met === true,
      text: r.met === null ? `${r.text}; not yet tested` : r.text,
    })),
    missing: labelsOf(spec, judgement.missing),
    failing: labelsOf(spec, judgement.failing),
    releasable: judgement.releasable,
    decision: {
      status,
      statusText: decisionText(status, lot.deviation),
      by: status === "HELD" && lot.decidedAt === null ? null : lot.decidedBy,
      at: lot.decidedAt,
      deviation: status === "RELEASED" && lot.deviation,
      reason: lot.decisionReason,
    },
    released: status === "RELEASED",
    generatedAt: input.generatedAt,
    timeZone: input.timeZone,
  };
}
