// Links under a trace answer: its tables as CSV and its movements as GS1 EPCIS 2.0 events.

export function csvHref(params: Record<string, string>): string {
  return `/trace/csv?${new URLSearchParams(Object.entries(params).filter(([, v]) => v !== "")).toString()}`;
}

/** The trace answer as GS1 EPCIS 2.0 events, for a trading partner's systems. */
export function EpcisLink({ params }: { params: Record<string, string | undefined> }) {
  const query = new URLSearchParams(
    Object.entries(params).filter((e): e is [string, string] => e[1] !== undefined && e[1] !== ""),
  ).toString();
  return (
    <p>
      <a href={`/api/epcis/trace?${query}`} download className="csv-link">
        EPCIS 2.0 events
      </a>{" "}
      <span className="muted">
        — the movements behind this answer in the GS1 standard format a trading partner&apos;s system reads
      </span>
    </p>
  );
}
