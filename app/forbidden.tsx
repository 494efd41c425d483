import Link from "next/link";

/** A page the signed-in role may not read: 403, a plain message and no data. */
export default function Forbidden() {
  return (
    <>
      <h1>Not available to your role</h1>
      <p className="empty">
        This page is kept for other roles at the plant. If your work needs it, ask your administrator.
      </p>
      <p>
        <Link href="/">Back to your start page</Link>
      </p>
    </>
  );
}
