"use client";
// The collector's phone page: today's route, the pickup form, and the outbox that sends when it can.
// The parts live beside it: collect-status (bar, sign in again), route-stops, pickup-form, outbox-lists;
// the form's state in use-draft and use-pickup-entry, the outbox in use-outbox.
import { useMemo, useState } from "react";
import { summarize } from "@/lib/collect/outbox";
import type { PhoneData, PhoneSource } from "@/app/collect/types";
import { useOutbox } from "@/app/collect/use-outbox";
import { localParts } from "@/app/collect/collect-text";
import { SignInAgain, StatusBar } from "@/app/collect/collect-status";
import { RouteStops } from "@/app/collect/route-stops";
import { PickupForm } from "@/app/collect/pickup-form";
import { SentList, WaitingList } from "@/app/collect/outbox-lists";
import { useDraft } from "@/app/collect/use-draft";
import { usePickupEntry } from "@/app/collect/use-pickup-entry";
import { DistanceQuestion, useDistanceBand } from "@/app/collect/distance-band";

/** Brings the form into view after a stop is tapped (on a phone the route fills the screen). */
function showForm() {
  const reduce = window.matchMedia?.("(prefers-reduced-motion: reduce)").matches ?? false;
  window.requestAnimationFrame(() =>
    document.getElementById("collect-form")?.scrollIntoView({ block: "start", behavior: reduce ? "auto" : "smooth" }),
  );
}

function Notices({
  offlineReady,
  storagePersisted,
  stale,
  routeDay,
}: {
  offlineReady: boolean;
  storagePersisted: boolean | null;
  stale: boolean;
  routeDay: string;
}) {
  return (
    <>
      <p className="collect-small muted">
        {offlineReady ? "This page also opens without a connection." : "Preparing the offline copy of this page…"}
        {storagePersisted === false
          ? " The browser may clear stored data when space runs low; send entries when you can."
          : ""}
      </p>
      {stale ? (
        <p className="form-error" data-stale-route>
          The route and history below are from {routeDay}, when this page was last loaded with a connection. Reload with
          a connection for today&apos;s route.
        </p>
      ) : null}
    </>
  );
}

export function CollectApp({ data }: { data: PhoneData }) {
  const [user, setUser] = useState(data.user);
  const system = user.unitSystem;
  const sourcesByCode = useMemo(() => new Map(data.sources.map((s) => [s.code, s])), [data.sources]);
  const known = useMemo(() => new Set(data.sources.map((s) => s.code)), [data.sources]);
  const routeCodes = useMemo(() => new Set(data.route.map((r) => r.code)), [data.route]);
  const [showAllStops, setShowAllStops] = useState(false);
  const ob = useOutbox(user.userId, data.builtAt);
  const { draft, setDraft, set } = useDraft();
  const distance = useDistanceBand();

  const pickedCode = draft.sourceCode.trim().toUpperCase();
  const source: PhoneSource | undefined = sourcesByCode.get(pickedCode);
  const materials = source?.materials.length ? source.materials : ["USED_COOKING_OIL"];
  const material = materials.includes(draft.material) ? draft.material : (materials[0] ?? "USED_COOKING_OIL");
  const entry = usePickupEntry({
    box: ob.box,
    entries: ob.entries,
    user,
    timeZone: data.timeZone,
    known,
    draft,
    setDraft,
    material,
    refresh: ob.refresh,
    flush: () => ob.flush(),
    announce: ob.announce,
    bandFor: distance.bandFor,
    stop: source?.position ?? null,
  });

  const choose = (code: string) => {
    entry.chooseSource(code);
    setShowAllStops(false);
  };
  const signedIn = async (u: PhoneData["user"]) => {
    setUser(u);
    ob.setNeedSignIn(null);
    await ob.flush(u.userId);
  };

  const summary = summarize(ob.entries, user.userId, ob.now);
  const today = localParts(ob.now, data.timeZone).day;
  const heldLogins = [
    ...new Set(ob.entries.filter((e) => e.enteredBy.userId !== user.userId).map((e) => e.enteredBy.login)),
  ];
  const view = { sourcesByCode, system, timeZone: data.timeZone, today };

  return (
    <div
      className="collect-app"
      data-outbox-ready={ob.boxReady ? "1" : "0"}
      data-offline-ready={ob.offlineReady ? "1" : "0"}
    >
      <StatusBar online={ob.online} waiting={ob.entries.length} sending={ob.sending} onSend={() => void ob.flush()} />
      <DistanceQuestion consent={distance.consent} answer={distance.answer} />
      <Notices
        offlineReady={ob.offlineReady}
        storagePersisted={ob.storagePersisted}
        stale={today !== data.today}
        routeDay={data.today}
      />
      {ob.needSignIn ? (
        <SignInAgain why={ob.needSignIn} waiting={summary.waiting} login={user.login} onSignedIn={signedIn} />
      ) : null}
      {!user.mayRecord ? (
        <p className="form-error">
          Only collectors and production staff record pickups; this account can look but not save.
        </p>
      ) : null}

      <h1 className="collect-title">Collect</h1>
      <RouteStops
        route={data.route}
        sourcesByCode={sourcesByCode}
        pickedCode={pickedCode}
        showAll={showAllStops}
        onShowAll={() => setShowAllStops(true)}
        onPick={(code) => {
          choose(code);
          showForm();
        }}
      />
      <PickupForm
        {...{
          draft,
          set,
          errors: entry.errors,
          system,
          sources: data.sources,
          routeCodes,
          source,
          materials,
          material,
          timeZone: data.timeZone,
          today,
        }}
        editing={entry.editingKey !== null}
        mayRecord={user.mayRecord}
        boxReady={ob.boxReady}
        saved={entry.saved}
        onChooseSource={choose}
        onSubmit={entry.save}
        onStopEditing={entry.stopEditing}
      />
      <WaitingList
        entries={ob.entries}
        lastProblem={ob.lastProblem}
        stale={summary.stale}
        heldLogins={heldLogins}
        view={view}
        onFix={entry.edit}
        onDiscard={(e) => void entry.discard(e)}
      />
      <p className="collect-links">
        <a href="/labels/scan">Scan a label</a> · <a href="/labels">Print labels</a>
      </p>
      <SentList sentNow={ob.sentNow} received={data.received} view={view} />
    </div>
  );
}
