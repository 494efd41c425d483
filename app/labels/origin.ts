import "server-only";
import { headers } from "next/headers";

/** This app's origin as the browser reached it, for the URLs printed in QR codes. */
export async function requestOrigin(): Promise<string> {
  const h = await headers();
  const host = h.get("x-forwarded-host") ?? h.get("host") ?? "127.0.0.1";
  const bare = host.replace(/:\d+$/, "");
  const proto = h.get("x-forwarded-proto") ?? (["127.0.0.1", "localhost", "[::1]"].includes(bare) ? "http" : "https");
  return `${proto}://${host}`;
}
