import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import { insertSite, insertUser } from "@/lib/site/site.store";
import { hashPassword } from "@/lib/auth/password";
import { resolveSession, signIn, signOut } from "@/lib/auth/session.service";
import { IDLE_TIMEOUT_MS, MAX_FAILURES_PER_LOGIN, MAX_FAILURES_PER_LOGIN_AND_IP } from "@/lib/auth/session-rules";
import { unlockSignIn } from "@/lib/auth/user.service";
import { revokeUserSessions } from "@/lib/auth/session.store";

const now = new Date("2026-03-01T09:00:00Z");
const later = (ms: number) => new Date(now.getTime() + ms);

describe.each(PROVIDERS)("sign-in and sessions on %s", (provider) => {
  let t: TestDb;
  let userId = 0;
  beforeAll(async () => {
    t = await createTestDb(provider);
    const site = await insertSite(t.db, { code: "S", name: "S", town: "T", timeZone: "UTC" });
    userId = (
      await insertUser(t.db, {
        siteId: site.id,
        login: "tess",
        fullName: "Tess",
        role: "PRODUCTION",
        passwordHash: await hashPassword("correct horse"),
      })
    ).id;
    await insertUser(t.db, {
      siteId: site.id,
      login: "eve",
      fullName: "Eve",
      role: "COLLECTOR",
      passwordHash: await hashPassword("another one"),
    });
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

  // OWASP ASVS 5.0 V6.3.1 and the OWASP Authentication Cheat Sheet ("account lockout"): throttle guessing
  // without letting a stranger lock a colleague out — per name and address, per address, and per name overall.
  it("a stranger's failures lock only the stranger's address for that name; the owner signs in from theirs", async () => {
    for (let i = 0; i < MAX_FAILURES_PER_LOGIN_AND_IP; i++)
      await signIn(t.db, { login: "tess", password: `guess ${i}` }, { ip: "10.9.9.9", now: later(100 + i) });
    const stranger = await signIn(
      t.db,
      { login: "tess", password: "correct horse" },
      { ip: "10.9.9.9", now: later(200) },
    );
    expect(stranger.ok ? "ok" : stranger.issues[0]?.code).toBe("AUTH.RATE_LIMITED");
    const owner = await signIn(t.db, { login: "tess", password: "correct horse" }, { ip: "10.0.0.5", now: later(300) });
    expect(owner.ok).toBe(true);
  });

  it("throttles guessing spread over many addresses, even with the right password afterwards", async () => {
    for (let i = 0; i < MAX_FAILURES_PER_LOGIN; i++)
      await signIn(
        t.db,
        { login: "eve", password: `wrong ${i}` },
        { ip: `10.0.${1 + Math.floor(i / 200)}.${i % 200}`, now: later(1_000 + i) },
      );
    const r = await signIn(t.db, { login: "eve", password: "another one" }, { ip: "10.0.2.1", now: later(10_000) });
    expect(r.ok ? "ok" : r.issues[0]?.code).toBe("AUTH.RATE_LIMITED");
    const afterWindow = await signIn(
      t.db,
      { login: "eve", password: "another one" },
      { ip: "10.0.2.1", now: later(16 * 60_000) },
    );
    expect(afterWindow.ok).toBe(true);
  });

  it("an administrator's unlock lets a locked name sign in at once, and is audited", async () => {
    const site = await t.db.site.findFirstOrThrow();
    const admin = await insertUser(t.db, {
      siteId: site.id,
      login: "ada",
      fullName: "Ada",
      role: "ADMIN",
      passwordHash: await hashPassword("admin words here"),
    });
    const at = later(40 * 60_000);
    for (let i = 0; i < MAX_FAILURES_PER_LOGIN_AND_IP; i++)
      await signIn(t.db, { login: "eve", password: `typo ${i}` }, { ip: "10.1.1.1", now: new Date(at.getTime() + i) });
    expect(
      (
        await signIn(
          t.db,
          { login: "eve", password: "another one" },
          { ip: "10.1.1.1", now: new Date(at.getTime() + 10) },
        )
      ).ok,
    ).toBe(false);
    const unlocked = await unlockSignIn(
      t.db,
      { siteId: site.id, userId: admin.id, now: new Date(at.getTime() + 20) },
      { login: "eve", reason: "Remembered the password" },
    );
    expect(unlocked.ok).toBe(true);
    expect(
      (
        await signIn(
          t.db,
          { login: "eve", password: "another one" },
          { ip: "10.1.1.1", now: new Date(at.getTime() + 30) },
        )
      ).ok,
    ).toBe(true);
    expect(
      await t.db.auditEvent.count({ where: { entity: "User", entityKey: "eve", reason: "Remembered the password" } }),
    ).toBe(1);
  });

  it("revokes every session of a user", async () => {
    const r = await signIn(
      t.db,
      { login: "tess", password: "correct horse" },
      { ip: "127.0.0.1", now: later(20 * 60_000) },
    );
    if (!r.ok) throw new Error("sign-in");
    expect(await revokeUserSessions(t.db, userId, later(21 * 60_000))).toBeGreaterThanOrEqual(1);
    expect(await resolveSession(t.db, r.value.token, later(22 * 60_000))).toBeNull();
  });
});
