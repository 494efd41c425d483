import type { Metadata } from "next";
import Link from "next/link";
import { listFlags } from "@/lib/screening/screening.store";
import type { FlagRow } from "@/lib/screening/screening.store";
import { SIGNAL_LABELS } from "@/lib/screening/screening";
import { confidenceOf, DEFAULT_SCREENING_SETTINGS, SCREENING_SETTING_LABELS } from "@/lib/screening/screening-defaults";
import type { ScreeningSettings } from "@/lib/screening/screening-defaults";
import { getScreeningSettings } from "@/lib/screening/screening-settings.service";
import { SIGNAL_RULES } from "@/lib/screening/signal-rules";
import { loadSite } from "@/app/_ui/site";
import { NoSite } from "@/app/_ui/ui";
import { ActionForm, Field } from "@/app/_ui/kit/action-form";
import { ConfidenceMark, DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { decideFlagAction, screenPeriodAction } from "@/app/screening/actions";
import { flagColumns } from "@/app/screening/flag-columns";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Source checks" };

function DecideForms({ flag }: { flag: FlagRow }) {
  return (
    <details className="decide">
      <summary>Decide on flag {flag.id}</summary>
      <ActionForm
        action={decideFlagAction}
        submitLabel="Confirm flag"
        label={`Confirm flag ${flag.id}`}
        hidden={{ flagId: String(flag.id), decision: "CONFIRM" }}
      >
        <Field name="watch" label="Put the source on watch" type="checkbox" defaultValue="yes" />
        <Field name="holdLots" label="Hold its lots still on site" type="checkbox" />
        <Field name="withholdCredit" label="Withhold its certified credit until cleared" type="checkbox" />
        <Field name="reason" label="Note" type="textarea" maxLength={500} />
      </ActionForm>
      <ActionForm
        action={decideFlagAction}
        submitLabel="Dismiss flag"
        label={`Dismiss flag ${flag.id}`}
        hidden={{ flagId: String(flag.id), decision: "DISMISS" }}
      >
        <Field name="reason" label="Why it is dismissed" type="textarea" maxLength={500} required />
      </ActionForm>
    </details>
  );
}

type RuleRow = (typeof SIGNAL_RULES)[number];

/** What each check reads and the thresholds it uses, each with how sure the default is. */
/** The checks and the thresholds in force at this site (its own values, or the defaults). */
const ruleColumns = (inForce: ScreeningSettings): Array<Column<RuleRow>> => [
  { key: "check", header: "Check", cell: (r) => SIGNAL_LABELS[r.signal] },
  { key: "reads", header: "Reads", cell: (r) => r.reads },
  {
    key: "threshold",
    header: "Thresholds",
    cell: (r) =>
      r.settings.length === 0 ? (
        "—"
      ) : (
        <ul className="plain">
          {r.settings.map((k) => {
            const s = inForce[k];
            return (
              <li key={k}>
                {SCREENING_SETTING_LABELS[k]}: {s.value} {s.unit}{" "}
                <ConfidenceMark level={confidenceOf(DEFAULT_SCREENING_SETTINGS[k])} anchor={`screening-${k}`} />
              </li>
            );
          })}
        </ul>
      ),
  },
];

export default async function ScreeningPage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const tz = site.timeZone;
  const [open, decided, s] = await Promise.all([
    listFlags(db, site.id, { status: ["OPEN"] }),
    listFlags(db, site.id, { status: ["CONFIRMED", "DISMISSED", "CLEARED"], take: 50 }),
    getScreeningSettings(db, site.id),
  ]);
  const compliance = user.role === "COMPLIANCE";
  const c = flagColumns(tz);
  const openColumns: Array<Column<FlagRow>> = [
    c.raised,
    c.source,
    c.check,
    c.found,
    c.records,
    ...(compliance ? [{ key: "decide", header: "Decision", cell: (f: FlagRow) => <DecideForms flag={f} /> }] : []),
  ];
  const decidedColumns = [c.decidedAt, c.source, c.check, c.state, c.by, c.reason, c.found];
  const ruleRows = SIGNAL_RULES.map((r) => ({ ...r, key: r.signal }));
  return (
    <>
      <h1>Source checks</h1>
      <p className="lede">
        Used oil that does not look like it came from where the records say: more than a source can give, far from its
        own history or its kind, lab results of fresh oil or of added water, and pickups out of pattern. Each source is
        checked when a pickup, lot or lab result is recorded; check any period here.
      </p>
      {compliance ? (
        <section aria-labelledby="run-h">
          <h2 id="run-h">Check a period</h2>
          <ActionForm action={screenPeriodAction} submitLabel="Check all sources" label="Check a period" keepValues>
            <Field name="from" label="From" type="date" />
            <Field name="to" label="To" type="date" />
          </ActionForm>
        </section>
      ) : null}
      <section aria-labelledby="open-h">
        <h2 id="open-h">To review ({open.length})</h2>
        <DataTable
          caption="Flags to review"
          hideCaption
          columns={openColumns}
          rows={open}
          rowKey={(f) => f.id}
          empty="Nothing to review."
        />
      </section>
      <section aria-labelledby="decided-h">
        <h2 id="decided-h">Decided</h2>
        <DataTable
          caption="Decided flags"
          hideCaption
          columns={decidedColumns}
          rows={decided}
          rowKey={(f) => f.id}
          empty="No decisions yet."
        />
      </section>
      <section aria-labelledby="rules-h">
        <h2 id="rules-h">What each check reads</h2>
        <p>
          <Link href="/screening/thresholds">Thresholds in force and their changes</Link>
        </p>
        <DataTable
          caption="Checks and thresholds"
          hideCaption
          rows={ruleRows}
          rowKey={(r) => r.key}
          empty="No checks."
          columns={ruleColumns(s)}
        />
      </section>
    </>
  );
}
