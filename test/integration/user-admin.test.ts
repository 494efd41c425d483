import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import { insertSite, insertUser } from "@/lib/site/site.store";
import { hashPassword } from "@/lib/auth/password";
import { resolveSession, signIn } from "@/lib/auth/session.service";
import { changeOwnPassword, changeUser, createUser, endSessions, resetPassword } from "@/lib/auth/user.service";
import { listRecordHistory, loadChain } from "@/lib/audit/audit.store";
import { verifyChain } from "@/lib/audit/chain";

const now = new Date("2026-03-01T09:00:00Z");
const at = (minutes: number) => new Date(now.getTime() + minutes * 60_000);

// OWASP ASVS 5.0 V7.4 (session termination): disabling an account or changing its password ends its
// sessions; accounts are never deleted and every change is in the audit trail (integrity.md).
describe.each(PROVIDERS)("account administration on %s", (provider) => {
  let t: TestDb;
  let admin = { siteId: 0, userId: 0, now };
  beforeAll(async () => {
    t = await createTestDb(provider);
    const site = await insertSite(t.db, { code: "S", name: "S", town: "T", timeZone: "UTC" });
    const id = (
      await insertUser(t.db, {
        siteId: site.id,
        login: "jory",
        fullName: "Jory",
        role: "ADMIN",
        passwordHash: await hashPassword("admin password"),
      })
    ).id;
    admin = { siteId: site.id, userId: id, now };
  });
  afterAll(async () => {
    await t.drop();
  });

  it("creates an account that can sign in, keeping the password out of the audit trail", async () => {
    const r = await createUser(t.db, admin, {
      login: "Wen.Collector",
      fullName: "Wen",
      role: "COLLECTOR",
      password: "kerbside pickups",
    });
    expect(r.ok && r.value.login).toBe("wen.collector");
    const s = await signIn(t.db, { login: "wen.collector", password: "kerbside pickups" }, { ip: "10.1.1.1", now });
    expect(s.ok && s.value.user.role).toBe("COLLECTOR");
    const history = await listRecordHistory(t.db, admin.siteId, "User", "wen.collector");
    expect(history).toHaveLength(1);
    expect(history[0]?.after).not.toContain("kerbside");
    expect(history[0]?.after).not.toContain("argon2");
  });

  it("refuses bad input naming the field, and a taken user name", async () => {
    const short = await createUser(t.db, admin, { login: "ab", fullName: "", role: "CHIEF", password: "short" });
    expect(short.ok).toBe(false);
    if (!short.ok) expect(short.issues.map((i) => i.field).sort()).toEqual(["fullName", "login", "password", "role"]);
    const taken = await createUser(t.db, admin, {
      login: "wen.collector",
      fullName: "Other",
      role: "COLLECTOR",
      password: "another long one",
    });
    expect(!taken.ok && taken.issues[0]).toMatchObject({ code: "RECORD.DUPLICATE", field: "login" });
    expect(await t.db.user.count()).toBe(2);
  });

  it("holds an administrator-set password until its owner chooses their own", async () => {
    const r = await createUser(t.db, admin, {
      login: "orrin",
      fullName: "Orrin",
      role: "PRODUCTION",
      password: "given at the counter",
    });
    expect(r.ok).toBe(true);
    const s = await signIn(t.db, { login: "orrin", password: "given at the counter" }, { ip: "10.1.1.2", now });
    if (!s.ok) throw new Error("sign-in");
    expect(s.value.user.mustChangePassword).toBe(true);
    const me = { siteId: admin.siteId, userId: s.value.user.userId, now };
    const wrong = await changeOwnPassword(t.db, me, {
      current: "not it",
      password: "kettle lantern orchard",
      confirm: "kettle lantern orchard",
    });
    expect(wrong.ok ? "ok" : wrong.issues[0]?.field).toBe("current");
    const differ = await changeOwnPassword(t.db, me, {
      current: "given at the counter",
      password: "kettle lantern orchard",
      confirm: "kettle lantern",
    });
    expect(differ.ok ? "ok" : differ.issues[0]?.field).toBe("confirm");
    const same = await changeOwnPassword(t.db, me, {
      current: "given at the counter",
      password: "given at the counter",
      confirm: "given at the counter",
    });
    expect(same.ok ? "ok" : same.issues[0]?.field).toBe("password");
    expect(
      (
        await changeOwnPassword(t.db, me, {
          current: "given at the counter",
          password: "kettle lantern orchard",
          confirm: "kettle lantern orchard",
        })
      ).ok,
    ).toBe(true);
    expect((await resolveSession(t.db, s.value.token, now))?.mustChangePassword).toBe(false);
    const reset = await resetPassword(t.db, admin, {
      login: "orrin",
      password: "second given one",
      reason: "Forgot it",
    });
    expect(reset.ok).toBe(true);
    const again = await signIn(t.db, { login: "orrin", password: "second given one" }, { ip: "10.1.1.2", now });
    expect(again.ok && again.value.user.mustChangePassword).toBe(true);
  });

  it("deactivating ends the account's sessions at once and blocks sign-in; reactivating needs a new sign-in", async () => {
    const s = await signIn(t.db, { login: "wen.collector", password: "kerbside pickups" }, { ip: "10.1.1.2", now });
    if (!s.ok) throw new Error("sign-in failed");
    expect(await resolveSession(t.db, s.value.token, at(1))).not.toBeNull();
    const noReason = await changeUser(t.db, admin, { login: "wen.collector", active: false, reason: "" });
    expect(!noReason.ok && noReason.issues[0]?.field).toBe("reason");
    const off = await changeUser(
      t.db,
      { ...admin, now: at(2) },
      { login: "wen.collector", active: false, reason: "Left the company" },
    );
    expect(off.ok && off.value.sessionsEnded).toBeGreaterThanOrEqual(2);
    expect(await resolveSession(t.db, s.value.token, at(3))).toBeNull();
    const again = await signIn(
      t.db,
      { login: "wen.collector", password: "kerbside pickups" },
      { ip: "10.1.1.3", now: at(4) },
    );
    expect(!again.ok && again.issues[0]?.code).toBe("AUTH.DISABLED");
    expect((await changeUser(t.db, admin, { login: "wen.collector", active: true, reason: "Came back" })).ok).toBe(
      true,
    );
    expect(await resolveSession(t.db, s.value.token, at(5))).toBeNull();
  });

  it("a password reset ends sessions and only the new password works", async () => {
    const s = await signIn(
      t.db,
      { login: "wen.collector", password: "kerbside pickups" },
      { ip: "10.1.1.4", now: at(10) },
    );
    if (!s.ok) throw new Error("sign-in failed");
    const r = await resetPassword(
      t.db,
      { ...admin, now: at(11) },
      { login: "wen.collector", password: "a new long password", reason: "Forgot it" },
    );
    expect(r.ok).toBe(true);
    expect(await resolveSession(t.db, s.value.token, at(12))).toBeNull();
    expect(
      (await signIn(t.db, { login: "wen.collector", password: "kerbside pickups" }, { ip: "10.1.1.5", now: at(13) }))
        .ok,
    ).toBe(false);
    expect(
      (await signIn(t.db, { login: "wen.collector", password: "a new long password" }, { ip: "10.1.1.5", now: at(14) }))
        .ok,
    ).toBe(true);
    const ended = await endSessions(t.db, { ...admin, now: at(15) }, { login: "wen.collector", reason: "Phone lost" });
    expect(ended.ok && ended.value.sessionsEnded).toBe(1);
  });

  it("never leaves the site without an active administrator", async () => {
    const demote = await changeUser(t.db, admin, { login: "jory", role: "COMPLIANCE", reason: "Testing" });
    expect(!demote.ok && demote.issues[0]).toMatchObject({ code: "USER.LAST_ADMIN", field: "role" });
    const off = await changeUser(t.db, admin, { login: "jory", active: false, reason: "Testing" });
    expect(!off.ok && off.issues[0]).toMatchObject({ code: "USER.LAST_ADMIN", field: "active" });
  });

  it("records every change with old and new values in an intact chain", async () => {
    const history = await listRecordHistory(t.db, admin.siteId, "User", "wen.collector");
    expect(history.map((h) => h.action)).toEqual(["CREATE", "CHANGE", "CHANGE", "CHANGE", "CHANGE"]);
    expect(JSON.parse(history[1]?.before ?? "{}")).toEqual({ active: true });
    expect(history[1]?.reason).toBe("Left the company");
    expect(verifyChain(await loadChain(t.db, admin.siteId)).ok).toBe(true);
  });
});
