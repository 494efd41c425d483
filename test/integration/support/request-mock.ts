import { readersOf } from "@/lib/auth/read-matrix";

export interface MockSession {
  user: null | { siteId: number; userId: number; now: Date; role: string };
}

/**
 * Stands in for lib/auth/request.service in route-handler tests: the session comes from the test, and
 * the role and read-matrix checks run as served.
 */
export function requestServiceMock(session: MockSession) {
  const requireRole = (roles: readonly string[]) => {
    const u = session.user;
    if (u === null)
      return Promise.resolve({ ok: false, issues: [{ code: "AUTH.UNAUTHENTICATED", message: "Sign in first" }] });
    if (!roles.includes(u.role))
      return Promise.resolve({ ok: false, issues: [{ code: "AUTH.FORBIDDEN", message: "wrong role" }] });
    return Promise.resolve({ ok: true, value: { ...u, login: "t", fullName: "T" } });
  };
  const requireReader = (request: Request) => {
    const roles = readersOf(new URL(request.url).pathname);
    return requireRole(roles === "public" ? ["COLLECTOR", "PRODUCTION", "COMPLIANCE", "ADMIN"] : roles);
  };
  return { requireRole, requireReader, getSignedIn: () => Promise.resolve(session.user) };
}
