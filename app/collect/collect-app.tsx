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

/** Above the route: the connection and outbox bar, the questions and notices, and signing in again to send. */
function CollectTop({
  ob,
  distance,
  stale,
  routeDay,
  waiting,
  user,
  onSignedIn,
}: {
  ob: ReturnType<typeof useOutbox>;
  distance: ReturnType<typeof useDistanceBand>;
  stale: boolean;
  routeDay: string;
  waiting: number;
  user: PhoneData["user"];
  onSignedIn: (u: PhoneData["user"]) => Promise<void>;
}) {
  return (
    <>
      <StatusBar online={ob.online} waiting={ob.entries.length} sending={ob.sending} onSend={() => void ob.flush()} />
      <DistanceQuestion consent={distance.consent} answer={distance.answer} />
      <Notices
        offlineReady={ob.offlineReady}
        storagePersisted={ob.storagePersisted}
        stale={stale}
        routeDay={routeDay}
      />
      {ob.needSignIn ? (
        <SignInAgain why={ob.needSignIn} waiting={waiting} login={user.login} onSignedIn={onSignedIn} />
      ) : null}
      {!user.mayRecord ? (
        <p className="form-error">
          Only collectors and production staff record pickups; this account can look but not save.
        </p>
      ) : null}
    </>
  );
}

/** The page's state: who is signed in, the outbox, the form being typed and the stop chosen. */
function useCollect(data: PhoneData) {
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
  return {
    user,
    system,
    sourcesByCode,
    routeCodes,
    showAllStops,
    setShowAllStops,
    ob,
    draft,
    set,
    distance,
    pickedCode,
    source,
    materials,
    material,
    entry,
    choose,
    signedIn,
    summary,
    today,
    heldLogins,
    view,
  };
}

export function CollectApp({ data }: { data: PhoneData }) {
  const c = useCollect(data);
  const { ob, entry, user } = c;
  return (
    <div
      className="collect-app"
      data-outbox-ready={ob.boxReady ? "1" : "0"}
      data-offline-ready={ob.offlineReady ? "1" : "0"}
    >
      <CollectTop
        ob={ob}
        distance={c.distance}
        stale={c.today !== data.today}
        routeDay={data.today}
        waiting={c.summary.waiting}
        user={user}
        onSignedIn={c.signedIn}
      />

      <h1 className="collect-title">Collect</h1>
      <RouteStops
        route={data.route}
        sourcesByCode={c.sourcesByCode}
        pickedCode={c.pickedCode}
        showAll={c.showAllStops}
        onShowAll={() => c.setShowAllStops(true)}
        onPick={(code) => {
          c.choose(code);
          showForm();
        }}
      />
      <PickupForm
        draft={c.draft}
        set={c.set}
        errors={entry.errors}
        system={c.system}
        sources={data.sources}
        routeCodes={c.routeCodes}
        source={c.source}
        materials={c.materials}
        material={c.material}
        timeZone={data.timeZone}
        today={c.today}
        editing={entry.editingKey !== null}
        mayRecord={user.mayRecord}
        boxReady={ob.boxReady}
        saved={entry.saved}
        onChooseSource={c.choose}
        onSubmit={entry.save}
        onStopEditing={entry.stopEditing}
      />
      <WaitingList
        entries={ob.entries}
        lastProblem={ob.lastProblem}
        stale={c.summary.stale}
        heldLogins={c.heldLogins}
        view={c.view}
        onFix={entry.edit}
        onDiscard={(e) => void entry.discard(e)}
      />
      <p className="collect-links">
        <a href="/labels/scan">Scan a label</a> · <a href="/labels">Print labels</a>
      </p>
      <SentList sentNow={ob.sentNow} received={data.received} view={c.view} />
    </div>
  );
}
