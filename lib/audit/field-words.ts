// How a recorded field and its value read on the history page: words, not stored names; kilograms and
// litres, not the grams and millilitres the books keep; labels, not stored codes. Pure.
import { LABELS } from "@/lib/core/vocabulary";

/** Stored names whose plain words are not simply their split spelling. */
const FIELD_WORDS: Readonly<Record<string, string>> = {
  code: "Number",
  ffaPct: "FFA",
  observedAt: "Observed",
  receivedAt: "Received",
  createdAt: "Recorded",
  startedAt: "Started",
  finishedAt: "Finished",
  sampledAt: "Sampled",
  shippedAt: "Shipped",
  hauledAt: "Hauled away",
  closedAt: "Closed",
  reopenedAt: "Reopened",
  sessionsEnded: "Sessions ended",
  mustChangePassword: "Must choose a new password",
  idempotencyKey: "Submission key",
  certificateNo: "Certificate no.",
  tempC: "Temperature",
  pickupEveryDays: "Usual days between pickups",
  unitSystem: "Units",
};

interface Unit {
  suffix: RegExp;
  unit: string;
  scale: number;
}

/** Stored unit suffixes: the books keep integer grams and millilitres (shown as kg and L). */
const UNITS: readonly Unit[] = [
  { suffix: /G$/, unit: "kg", scale: 1000 },
  { suffix: /Ml$/, unit: "L", scale: 1000 },
  { suffix: /Kg$/, unit: "kg", scale: 1 },
  { suffix: /L$/, unit: "L", scale: 1 },
  { suffix: /Pct$/, unit: "%", scale: 1 },
  { suffix: /C$/, unit: "°C", scale: 1 },
];

function unitOf(name: string): Unit | undefined {
  return UNITS.find(
    (u) => u.suffix.test(name) && name.replace(u.suffix, "") !== "" && /[a-z]$/.test(name.replace(u.suffix, "")),
  );
}

function splitWords(name: string): string {
  const spaced = name
    .replace(/Id$/, "")
    .replace(/([a-z0-9])([A-Z])/g, "$1 $2")
    .toLowerCase()
    .trim();
  return spaced.charAt(0).toUpperCase() + spaced.slice(1);
}

/** "lot.massG" → "Lot: mass (kg)"; "status" → "Status"; "ffaPct" → "FFA (%)". */
export function fieldWords(path: string): string {
  const parts = path.split(".");
  return parts
    .map((p, i) => {
      const named = FIELD_WORDS[p];
      const unit = unitOf(p);
      const base = named ?? splitWords(unit ? p.replace(unit.suffix, "") : p);
      const words = i === 0 ? base : base.toLowerCase();
      return unit ? `${words} (${unit.unit})` : words;
    })
    .join(": ");
}

/** A recorded value as it reads beside its field: codes as labels, grams as kg, ISO times trimmed. */
export function valueWords(path: string, value: string | null): string | null {
  if (value === null || value === "—") return value;
  const last = path.split(".").pop() ?? path;
  const unit = unitOf(last);
  if (unit && unit.scale !== 1 && /^-?\d+$/.test(value)) {
    return (Number(value) / unit.scale).toLocaleString("en", { minimumFractionDigits: 3, maximumFractionDigits: 3 });
  }
  if (value === "true") return "yes";
  if (value === "false") return "no";
  if (/^[A-Z][A-Z0-9_]+$/.test(value) && LABELS[value] !== undefined) return LABELS[value];
  if (/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.000)?Z$/.test(value)) return value.replace(/\.000Z$/, "Z");
  return value;
}
