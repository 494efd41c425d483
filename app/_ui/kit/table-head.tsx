/** A column heading of a table drawn by hand: its words, and how its column reads. */
export type Heading = string | { header: string; align: "num" | "tick" };

/** A heading over a column of numbers: right-aligned, as DataTable aligns them. */
export function numeric(header: string): Heading {
  return { header, align: "num" };
}

/**
 * The heading row of a table whose rows are drawn by hand (inputs in cells, merged cells), with the same
 * headings DataTable draws. A null heading is a column this reader does not see.
 */
export function TableHead({ headings }: { headings: ReadonlyArray<Heading | null> }) {
  return (
    <thead>
      <tr>
        {headings.map((h) =>
          h === null ? null : typeof h === "string" ? (
            <th key={h} scope="col">
              {h}
            </th>
          ) : (
            <th key={h.header} scope="col" className={h.align}>
              {h.header}
            </th>
          ),
        )}
      </tr>
    </thead>
  );
}
