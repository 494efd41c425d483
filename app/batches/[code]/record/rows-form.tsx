"use client";
import { formatFixed } from "@/lib/quantity/units";
import { completeBatchAction, startBatchAction } from "@/app/batches/[code]/record/actions";
import { toNumber } from "@/app/_ui/kit/form-state";
import { RowsForm } from "@/app/_ui/kit/rows-form";
import type { RowColumn, RowValues } from "@/app/_ui/kit/rows-form";

export interface ChargeRow extends RowValues {
  fromKind: string;
  fromCode: string;
  role: string;
  massKg: string;
}

export interface OutputRow extends RowValues {
  role: string;
  toKind: string;
  toCode: string;
  massKg: string;
}

const CHARGE_ROLES = [
  ["OIL", "Oil"],
  ["METHANOL", "Methanol"],
  ["CATALYST", "Catalyst"],
  ["ACID", "Acid"],
] as const;
const FROM_KINDS = [
  ["LOT", "Feedstock lot"],
  ["TANK", "Tank"],
  ["REAGENT_LOT", "Reagent lot"],
] as const;
const OUTPUT_ROLES = [
  ["ESTER", "Ester"],
  ["GLYCEROL_PHASE", "Glycerol phase"],
  ["WASH_WATER", "Wash water"],
  ["RECOVERED_METHANOL", "Recovered methanol"],
  ["LOSS", "Recorded loss (spill, leak)"],
] as const;
const TO_KINDS = [
  ["PRODUCT_LOT", "New product lot"],
  ["WASTE_CONTAINER", "Waste container"],
  ["TANK", "Tank"],
  ["", "— (recorded loss)"],
] as const;

function sumKg(rows: readonly RowValues[], key = "massKg"): number {
  return rows.reduce((s, r) => {
    const n = toNumber(r[key] ?? "");
    return s + (n !== undefined && Number.isFinite(n) ? n : 0);
  }, 0);
}

const CHARGE_COLUMNS: readonly RowColumn[] = [
  {
    header: "Charge",
    fields: [{ key: "role", kind: "select", options: CHARGE_ROLES, label: (i) => `Charge ${i + 1}` }],
  },
  {
    header: "Drawn from",
    fields: [{ key: "fromKind", kind: "select", options: FROM_KINDS, label: (i) => `Drawn from, row ${i + 1}` }],
  },
  { header: "Code", fields: [{ key: "fromCode", kind: "text", label: (i) => `Code, row ${i + 1}` }] },
  { header: "Mass (kg)", fields: [{ key: "massKg", kind: "number", label: (i) => `Mass in kg, row ${i + 1}` }] },
];

export function StartForm({ batchCode, initial }: { batchCode: string; initial: ChargeRow[] }) {
  return (
    <RowsForm
      action={startBatchAction}
      list="charges"
      label="Record the start"
      submitLabel="Record the start"
      hidden={{ batchCode }}
      columns={CHARGE_COLUMNS}
      initial={initial}
      newRow={{ fromKind: "REAGENT_LOT", fromCode: "", role: "METHANOL", massKg: "" }}
      removeLabel={(i) => `Remove row ${i + 1}`}
      footer={(rows) => (
        <tr>
          <td colSpan={3}>Total charged</td>
          <td className="num">{formatFixed(sumKg(rows), 3)} kg</td>
          <td />
        </tr>
      )}
    />
  );
}

const isWash = (r: RowValues) => r.role === "WASH_WATER";
const isLoss = (r: RowValues) => r.role === "LOSS";

const OUTPUT_COLUMNS: readonly RowColumn[] = [
  {
    header: "Output",
    fields: [{ key: "role", kind: "select", options: OUTPUT_ROLES, label: (i) => `Output ${i + 1}` }],
  },
  {
    header: "Goes to",
    fields: [
      {
        key: "toKind",
        kind: "select",
        options: TO_KINDS,
        label: (i) => `Goes to, row ${i + 1}`,
        showFor: (r) => !isLoss(r),
      },
    ],
  },
  {
    header: "Code",
    fields: [
      { key: "toCode", kind: "text", label: (i) => `Destination code, row ${i + 1}`, showFor: (r) => !isLoss(r) },
    ],
  },
  {
    header: "Weighed or gauged (kg)",
    fields: [{ key: "massKg", kind: "number", label: (i) => `Output mass in kg, row ${i + 1}` }],
  },
  {
    header: "Washing water, or what was lost",
    fields: [
      {
        key: "waterFromCode",
        kind: "text",
        caption: "water lot",
        label: (i) => `Water lot, row ${i + 1}`,
        showFor: isWash,
      },
      {
        key: "waterKg",
        kind: "number",
        caption: "water used (kg)",
        label: (i) => `Water used in kg, row ${i + 1}`,
        showFor: isWash,
      },
      {
        key: "reason",
        kind: "text",
        caption: "what happened",
        label: (i) => `Reason for the loss, row ${i + 1}`,
        showFor: isLoss,
      },
    ],
  },
];

/**
 * The finish: what was weighed or gauged out. The remainder is shown as it will be booked — the batch's
 * unmeasured difference — and flagged against the site's tolerance; nobody types it.
 */
export function FinishForm({
  batchCode,
  chargedKg,
  warnPct,
  initial,
}: {
  batchCode: string;
  chargedKg: number;
  warnPct: number;
  initial: OutputRow[];
}) {
  return (
    <RowsForm
      action={completeBatchAction}
      list="outputs"
      label="Record the finish"
      submitLabel="Record the finish"
      hidden={{ batchCode }}
      columns={OUTPUT_COLUMNS}
      initial={initial}
      newRow={{ role: "LOSS", toKind: "", toCode: "", massKg: "", reason: "" }}
      removeLabel={(i) => `Remove output row ${i + 1}`}
      footer={(rows) => {
        const waterKg = sumKg(rows.filter(isWash), "waterKg");
        const left = chargedKg + waterKg - sumKg(rows);
        const sharePct = chargedKg > 0 ? (left * 100) / chargedKg : 0;
        const over = Math.abs(sharePct) > warnPct;
        return (
          <>
            <tr>
              <td colSpan={3}>Measured out / charged{waterKg > 0 ? " + washing water" : ""}</td>
              <td className="num">
                {formatFixed(sumKg(rows), 3)} / {formatFixed(chargedKg + waterKg, 3)} kg
              </td>
              <td colSpan={2} />
            </tr>
            <tr>
              <td colSpan={3}>Unmeasured difference (booked when you record the finish)</td>
              <td className={`num ${over ? "over-under" : ""}`} data-testid="left-to-account">
                {formatFixed(left, 3)} kg
              </td>
              <td colSpan={2} className={over ? "over-under" : ""}>
                {formatFixed(sharePct, 2)} % of the charge
                {over ? ` — above the site's ${formatFixed(warnPct, 2)} %: weigh again if you can` : ""}
              </td>
            </tr>
          </>
        );
      }}
    />
  );
}
