import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import { insertSite, insertUser } from "@/lib/site/site.store";
import { hashPassword } from "@/lib/auth/password";
import { resolveSession, signIn, signOut } from "@/lib/auth/session.service";
import { IDLE_TIMEOUT_MS, MAX_FAILURES_PER_LOGIN } from "@/lib/auth/session-rules";
import { revokeUserSessions } from "@/lib/auth/session.store";

const now = new Date("2026-03-01T09:00:00Z");
const later = (ms: number) => new Date(now.getTime() + ms);

describe.each(PROVIDERS)("sign-in and sessions on %s", (provider) => {
  let t: TestDb;
  let userId = 0;
  beforeAll(async () => {
    t = await createTestDb(provider);
    const site = await insertSite(t.db, { code: "S", name: "S", town: "T", timeZone: "UTC" });
    userId = (await insertUser(t.db, { siteId: site.id, login: "tess", fullName: "Tess", role: "PRODUCTION", passwordHash: await hashPassword("correct horse") })).id;
    await insertUser(t.db, { siteId: site.id, login: "eve", fullName: "Eve", role: "COLLECTOR", passwordHash: await hashPassword("another one") });
  });
  afterAll(async () => {
    await t.drop();
  });

  it("stores argon2id hashes with the OWASP minimum parameters", async () => {
    const u = await t.db.user.findUniqueOrThrow({ where: { login: "tess" } });
    // OWASP Password Storage Cheat Sheet: argon2id, m=19 MiB, t=2, p=1.
    expect(u.passwordHash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
  });

  it("opens a session for the right password and stores only the token's hash", async () => {
    const r = await signIn(t.db, { login: "Tess ", password: "correct horse" }, { ip: "127.0.0.1", now });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.value.user.role).toBe("PRODUCTION");
    expect(await t.db.session.count({ where: { tokenHash: r.value.token } })).toBe(0);
    expect((await resolveSession(t.db, r.value.token, later(60_000)))?.userId).toBe(userId);
    expect(await resolveSession(t.db, r.value.token, later(IDLE_TIMEOUT_MS + 120_000))).toBeNull();
    await signOut(t.db, r.value.token, later(1000));
    expect(await resolveSession(t.db, r.value.token, later(2000))).toBeNull();
  });

  it("refuses a wrong password and an unknown user with the same message", async () => {
    const a = await signIn(t.db, { login: "eve", password: "nope" }, { ip: "10.0.0.9", now });
    const b = await signIn(t.db, { login: "nobody", password: "nope" }, { ip: "10.0.0.9", now });
    expect(a.ok || b.ok).toBe(false);
    if (!a.ok && !b.ok) expect(a.issues[0]?.message).toBe(b.issues[0]?.message);
  });

  it("throttles repeated failures for one user name, even with the right password afterwards", async () => {
    for (let i = 0; i < MAX_FAILURES_PER_LOGIN; i++) await signIn(t.db, { login: "eve", password: `wrong ${i}` }, { ip: `10.0.1.${i}`, now: later(i) });
    const r = await signIn(t.db, { login: "eve", password: "another one" }, { ip: "10.0.2.1", now: later(10_000) });
    expect(r.ok ? "ok" : r.issues[0]?.code).toBe("AUTH.RATE_LIMITED");
    const afterWindow = await signIn(t.db, { login: "eve", password: "another one" }, { ip: "10.0.2.1", now: later(16 * 60_000) });
    expect(afterWindow.ok).toBe(true);
  });

  it("revokes every session of a user", async () => {
    const r = await signIn(t.db, { login: "tess", password: "correct horse" }, { ip: "127.0.0.1", now: later(20 * 60_000) });
    if (!r.ok) throw new Error("sign-in");
    expect(await revokeUserSessions(t.db, userId, later(21 * 60_000))).toBeGreaterThanOrEqual(1);
    expect(await resolveSession(t.db, r.value.token, later(22 * 60_000))).toBeNull();
  });
});
