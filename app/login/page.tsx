import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { getSignedIn } from "@/lib/auth/request.service";
import { SignInForm } from "@/app/login/sign-in-form";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string | string[] }> }) {
  const raw = (await searchParams).next;
  const next = typeof raw === "string" ? raw : "/";
  if (await getSignedIn()) redirect(next.startsWith("/") && !next.startsWith("//") ? next : "/");
  return (
    <>
      <h1>Sign in to Tracevat</h1>
      <p className="lede">
        Each person signs in with their own account; every record you enter carries your name and the server&apos;s
        time.
      </p>
      <SignInForm next={next} />
    </>
  );
}
