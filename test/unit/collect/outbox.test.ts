import "fake-indexeddb/auto";
import { afterEach, describe, expect, it } from "vitest";
import { STALE_AFTER_MS, classifyReply, newEntry, sendable, signOutWarning, summarize } from "@/lib/collect/outbox";
import type { OutboxEntry, Reply } from "@/lib/collect/outbox";
import { flushOutbox, openOutbox } from "@/lib/collect/outbox-idb";
import type { Outbox } from "@/lib/collect/outbox-idb";

const IVO = { userId: 7, login: "collector.ivo", fullName: "Ivo" };
const OTHER = { userId: 8, login: "collector.ana", fullName: "Ana" };
const T0 = new Date("2026-12-02T08:00:00Z");
let n = 0;
function entry(by = IVO, savedAt = T0): OutboxEntry {
  n++;
  const key = `00000000-0000-4000-8000-${String(n).padStart(12, "0")}`;
  return newEntry(
    {
      code: `PU-261202-${String(n).padStart(8, "0")}`,
      sourceCode: "R001",
      material: "USED_COOKING_OIL",
      observedAt: savedAt.toISOString(),
      containers: 2,
      volumeL: 100,
      tempC: 20,
      idempotencyKey: key,
    },
    by,
    savedAt,
  );
}
const stored = (e: OutboxEntry, id: number): Reply => ({
  status: 200,
  body: { ok: true, value: { id, code: e.pickup.code, massG: 91_000, receivedAt: T0.toISOString() } },
});

describe("outbox replies: an entry leaves only on a 2xx carrying the stored record id", () => {
  const e = entry();
  it.each<[string, Reply, string]>([
    ["200 with id and our code", stored(e, 42), "STORED"],
    ["200 without an id", { status: 200, body: { ok: true, value: {} } }, "RETRY"],
    ["200 for another pickup number", { status: 200, body: { ok: true, value: { id: 3, code: "PU-OTHER" } } }, "RETRY"],
    ["200 with a non-JSON body", { status: 200, body: null }, "RETRY"],
    ["answer lost", { lost: "Failed to fetch" }, "RETRY"],
    ["500", { status: 500, body: null }, "RETRY"],
    ["502 proxy page", { status: 502, body: "<html>" }, "RETRY"],
    [
      "409 still in progress",
      { status: 409, body: { ok: false, issues: [{ code: "IDEMPOTENCY.IN_PROGRESS", message: "wait" }] } },
      "RETRY",
    ],
    [
      "401 session ended",
      { status: 401, body: { ok: false, issues: [{ code: "AUTH.UNAUTHENTICATED", message: "Sign in first" }] } },
      "SIGN_IN",
    ],
    [
      "403 wrong role",
      { status: 403, body: { ok: false, issues: [{ code: "AUTH.FORBIDDEN", message: "needs collector" }] } },
      "SIGN_IN",
    ],
    [
      "422 bad volume",
      {
        status: 422,
        body: {
          ok: false,
          issues: [{ code: "INPUT.INVALID", message: "Volume (L) must be more than 0 L", field: "volumeL" }],
        },
      },
      "REFUSED",
    ],
    [
      "404 unknown source",
      {
        status: 404,
        body: {
          ok: false,
          issues: [{ code: "RECORD.NOT_FOUND", message: "Source X does not exist", field: "sourceCode" }],
        },
      },
      "REFUSED",
    ],
  ])("%s → %s", (_n, reply, kind) => {
    expect(classifyReply(e, reply).kind).toBe(kind);
  });
});

describe("outbox state", () => {
  it("sends only the signed-in user's waiting entries, oldest first", () => {
    const a = entry(IVO, new Date("2026-12-02T09:00:00Z"));
    const b = entry(IVO, new Date("2026-12-02T08:00:00Z"));
    const c = entry(OTHER);
    const d = { ...entry(IVO), state: "REFUSED" as const };
    expect(sendable([a, b, c, d], IVO.userId).map((x) => x.key)).toEqual([b.key, a.key]);
  });

  it("summarises waiting, refused, held-for-others and overdue entries; nothing expires", () => {
    const old = entry(IVO, new Date(T0.getTime() - 8 * 24 * 3_600_000));
    const list = [old, entry(), entry(OTHER), { ...entry(), state: "REFUSED" as const }];
    const s = summarize(list, IVO.userId, new Date(T0.getTime() + 60_000));
    expect(s).toMatchObject({
      total: 4,
      waiting: 2,
      refused: 1,
      heldForOthers: 1,
      stale: 1,
      oldestSavedAt: old.savedAt,
    });
    expect(sendable(list, IVO.userId)).toContain(old); // 8 days old and still sent (integrity goal: never expires)
    expect(STALE_AFTER_MS).toBe(24 * 3_600_000);
  });

  it("warns on sign-out only when something is waiting", () => {
    expect(signOutWarning([])).toBeNull();
    expect(signOutWarning([entry(), entry()])).toMatch(/^2 pickups are still waiting/);
  });
});

describe("IndexedDB outbox and send loop (fake-indexeddb)", () => {
  let box: Outbox | null = null;
  afterEach(() => box?.close());
  const open = async () => (box = await openOutbox(`test-${Math.random()}`));

  it("keeps entries across re-opening the database (a page reload)", async () => {
    const name = `reload-${Math.random()}`;
    const first = await openOutbox(name);
    for (let i = 0; i < 20; i++) await first.add(entry());
    first.close();
    const again = await openOutbox(name);
    expect((await again.all()).length).toBe(20);
    again.close();
  });

  it("refuses a second save under the same idempotency key", async () => {
    const o = await open();
    const e = entry();
    await o.add(e);
    await expect(o.add(e)).rejects.toThrow();
    expect((await o.all()).length).toBe(1);
  });

  it("lost answer: the entry stays, the retry gets the stored id and the entry leaves — recorded once", async () => {
    const o = await open();
    const e = entry();
    await o.add(e);
    const server = new Map<string, number>(); // idempotency key → record id, as the unique column does
    let loseNext = true;
    const send = async (x: OutboxEntry): Promise<Reply> => {
      const id = server.get(x.key) ?? server.size + 1;
      server.set(x.key, id);
      if (loseNext) {
        loseNext = false;
        throw new TypeError("Failed to fetch");
      }
      return stored(x, id);
    };
    const first = await flushOutbox(o, IVO.userId, send, () => T0);
    expect(first).toMatchObject({
      sent: 1,
      stored: [],
      kept: 1,
      offline: expect.stringContaining("Failed to fetch") as string,
    });
    const kept = await o.all();
    expect(kept).toHaveLength(1);
    expect(kept[0]).toMatchObject({ attempts: 1, state: "WAITING" });
    const second = await flushOutbox(o, IVO.userId, send, () => T0);
    expect(second.stored).toEqual([
      {
        key: e.key,
        recordId: 1,
        code: e.pickup.code,
        receivedAt: T0.toISOString(),
        observedAt: e.pickup.observedAt,
        sourceCode: "R001",
      },
    ]);
    expect(await o.all()).toEqual([]);
    expect(server.size).toBe(1);
  });

  it("stops and keeps everything when the session has ended; sends after sign-in", async () => {
    const o = await open();
    for (let i = 0; i < 3; i++) await o.add(entry());
    let signedIn = false;
    let id = 100;
    const send = async (x: OutboxEntry): Promise<Reply> =>
      signedIn
        ? stored(x, ++id)
        : { status: 401, body: { ok: false, issues: [{ code: "AUTH.UNAUTHENTICATED", message: "Sign in first" }] } };
    const r = await flushOutbox(o, IVO.userId, send, () => T0);
    expect(r).toMatchObject({ sent: 1, kept: 1, signIn: expect.stringContaining("sign in") as string });
    expect(await o.all()).toHaveLength(3);
    signedIn = true;
    expect((await flushOutbox(o, IVO.userId, send, () => T0)).stored).toHaveLength(3);
    expect(await o.all()).toHaveLength(0);
  });

  it("marks a refused entry with the field and goes on with the rest", async () => {
    const o = await open();
    const bad = entry();
    const good = entry();
    await o.add(bad);
    await o.add(good);
    const send = async (x: OutboxEntry): Promise<Reply> =>
      x.key === bad.key
        ? {
            status: 404,
            body: {
              ok: false,
              issues: [{ code: "RECORD.NOT_FOUND", message: "Source R001 does not exist", field: "sourceCode" }],
            },
          }
        : stored(x, 9);
    const r = await flushOutbox(o, IVO.userId, send, () => T0);
    expect(r.stored.map((s) => s.key)).toEqual([good.key]);
    const left = await o.all();
    expect(left).toHaveLength(1);
    expect(left[0]).toMatchObject({ key: bad.key, state: "REFUSED", refusal: [{ field: "sourceCode" }] });
    // A refused entry is not sent again until the collector fixes it.
    expect((await flushOutbox(o, IVO.userId, send, () => T0)).sent).toBe(0);
  });

  it("leaves another collector's entries alone", async () => {
    const o = await open();
    await o.add(entry(OTHER));
    const r = await flushOutbox(
      o,
      IVO.userId,
      async (x) => stored(x, 1),
      () => T0,
    );
    expect(r.sent).toBe(0);
    expect(await o.all()).toHaveLength(1);
  });
});
