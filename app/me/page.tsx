import Link from "next/link";
import type { Metadata } from "next";
import { labelOf } from "@/lib/core/vocabulary";
import { loadSite } from "@/app/_ui/site";
import { HistoryLink, NoSite } from "@/app/_ui/ui";
import { UnitsForm } from "@/app/me/units-form";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Your settings" };

export default async function MePage() {
  const { site, user } = await loadSite();
  if (!site) return <NoSite />;
  return (
    <>
      <h1>Your settings</h1>
      <p className="lede">
        Signed in as {user.fullName} ({user.login}), {labelOf(user.role)}. Stored figures are always kept in kilograms,
        litres and °C; your choice changes only how they are shown and typed.{" "}
        <HistoryLink kind="user" recordKey={user.login} label="account" />
      </p>
      <UnitsForm current={user.unitSystem} />
      <p>
        <Link href="/me/password">Change your password</Link>
      </p>
      <p className="note">A different role, or a password you have forgotten: ask your administrator.</p>
    </>
  );
}
