// Next calls onRequestError for errors in pages, server actions and route handlers. The error page
// shows the digest as the reference; the same reference, the path and the stack go to the log.
import type { Instrumentation } from "next";

export const onRequestError: Instrumentation.onRequestError = async (error, request, context) => {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { log } = await import("@/lib/log/log.service");
  const digest = typeof error === "object" && error !== null && "digest" in error ? String(error.digest) : null;
  log.error(
    {
      reference: digest,
      route: context.routePath,
      path: request.path,
      method: request.method,
      kind: context.routerKind,
      err: error,
    },
    "unexpected error",
  );
};
