import Link from "next/link";

export default function NotFound() {
  return (
    <>
      <h1>Not found</h1>
      <p className="empty">There is no record with that number or code at this site.</p>
      <p>
        <Link href="/">Back to today</Link>
      </p>
    </>
  );
}
