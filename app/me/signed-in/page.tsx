import Link from "next/link";
import type { Metadata } from "next";
import { labelOf } from "@/lib/core/vocabulary";
import { loadSite } from "@/app/_ui/site";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Signed in" };

/** Who is signed in, and nothing else: the lightest page behind the sign-in (the load run's floor). */
export default async function SignedInPage() {
  const { user } = await loadSite();
  return (
    <>
      <h1>Signed in</h1>
      <p className="lede">
        {user.fullName} ({user.login}), {labelOf(user.role)}. <Link href="/me">Your settings</Link>
      </p>
    </>
  );
}
