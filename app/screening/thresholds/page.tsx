import type { Metadata } from "next";
import Link from "next/link";
import { getStoredScreeningSettings, listScreeningSettingChanges } from "@/lib/screening/screening-settings.store";
import type { ScreeningSettingHistoryRow } from "@/lib/screening/screening-settings.store";
import {
  confidenceOf,
  DEFAULT_SCREENING_SETTINGS,
  SCREENING_SETTING_KEYS,
  SCREENING_SETTING_LABELS,
} from "@/lib/screening/screening-defaults";
import type { ScreeningSettingKey } from "@/lib/screening/screening-defaults";
import { when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { NoSite, Note } from "@/app/_ui/ui";
import { ConfidenceMark, DataTable } from "@/app/_ui/kit";
import { ThresholdForm } from "@/app/screening/thresholds/threshold-form";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Source check thresholds" };

interface ThresholdRow {
  key: ScreeningSettingKey;
  label: string;
  unit: string;
  defaultValue: number;
  source: string;
  inForce: number;
  own: boolean;
}

export default async function ThresholdsPage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const [current, changes] = await Promise.all([
    getStoredScreeningSettings(db, site.id),
    listScreeningSettingChanges(db, site.id),
  ]);
  const canChange = user.role === "COMPLIANCE" || user.role === "ADMIN";
  const rows: ThresholdRow[] = SCREENING_SETTING_KEYS.map((key) => {
    const d = DEFAULT_SCREENING_SETTINGS[key];
    const own = current.stored.values[key];
    return {
      key,
      label: SCREENING_SETTING_LABELS[key],
      unit: d.unit,
      defaultValue: d.value,
      source: d.note ? `${d.source}; ${d.note}` : d.source,
      inForce: own ?? d.value,
      own: own !== undefined,
    };
  });
  return (
    <>
      <p className="crumbs">
        <Link href="/screening">Source checks</Link> /
      </p>
      <h1>Source check thresholds</h1>
      <p className="lede">
        The limits each source check works to. No standard says when used cooking oil is implausible, so most are
        starting points this site can change; each change needs a reason and is kept.
      </p>
      {current.changed ? (
        <p>
          Last changed {when(current.changed.at, site.timeZone)} by {current.changed.by}: {current.changed.reason}
        </p>
      ) : (
        <Note>This site uses the default thresholds.</Note>
      )}
      <ThresholdTable rows={rows} />
      {canChange ? (
        <section aria-labelledby="change-h">
          <h2 id="change-h">Change a threshold</h2>
          <ThresholdForm options={rows.map((r) => [r.key, `${r.label} (${r.unit})`] as const)} />
        </section>
      ) : null}
      <ChangesTable changes={changes} timeZone={site.timeZone} />
    </>
  );
}

function ThresholdTable({ rows }: { rows: ThresholdRow[] }) {
  return (
    <DataTable
      caption="Thresholds in force"
      rows={rows}
      rowKey={(r) => r.key}
      empty="No thresholds."
      columns={[
        { key: "label", header: "Threshold", cell: (r) => r.label },
        {
          key: "inForce",
          header: "In force",
          numeric: true,
          cell: (r) => (r.own ? <strong>{r.inForce}</strong> : r.inForce),
        },
        { key: "unit", header: "Unit", cell: (r) => r.unit },
        {
          key: "default",
          header: "Default",
          numeric: true,
          cell: (r) => (
            <>
              {r.defaultValue}{" "}
              <ConfidenceMark level={confidenceOf(DEFAULT_SCREENING_SETTINGS[r.key])} anchor={`screening-${r.key}`} />
            </>
          ),
        },
        { key: "whose", header: "Set by", cell: (r) => (r.own ? "this site" : "default") },
        { key: "source", header: "Where the default comes from", cell: (r) => r.source },
      ]}
    />
  );
}

function ChangesTable({ changes, timeZone }: { changes: ScreeningSettingHistoryRow[]; timeZone: string }) {
  return (
    <section aria-labelledby="changes-h">
      <h2 id="changes-h">Changes</h2>
      <DataTable
        caption="Threshold changes"
        hideCaption
        rows={changes.map((c, i) => ({ ...c, i }))}
        rowKey={(c) => c.i}
        empty="No changes: the defaults have always applied."
        columns={[
          { key: "at", header: "When", cell: (c) => when(c.at, timeZone) },
          { key: "by", header: "By", cell: (c) => c.by },
          { key: "reason", header: "Reason", cell: (c) => c.reason },
          {
            key: "values",
            header: "Site's own values after the change",
            cell: (c) =>
              Object.entries(c.values)
                .map(([k, v]) => `${SCREENING_SETTING_LABELS[k as ScreeningSettingKey]}: ${v}`)
                .join("; ") || "none (defaults)",
          },
        ]}
      />
    </section>
  );
}
