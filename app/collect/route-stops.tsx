"use client";
// Today's route: tap a stop to fill the form with it. Once one is picked the others fold away.
import type { PhoneSource, PhoneStop } from "@/app/collect/types";

function dueText(stop: PhoneStop): string {
  if (stop.dueDay === null) return "never collected";
  if (stop.daysOverdue === 0) return "due today";
  return `${stop.daysOverdue} day${stop.daysOverdue === 1 ? "" : "s"} overdue`;
}

interface RouteStopsProps {
  route: PhoneStop[];
  sourcesByCode: ReadonlyMap<string, PhoneSource>;
  pickedCode: string;
  showAll: boolean;
  onShowAll: () => void;
  onPick: (code: string) => void;
}

export function RouteStops({ route, sourcesByCode, pickedCode, showAll, onShowAll, onPick }: RouteStopsProps) {
  const pickedOnRoute = route.some((r) => r.code === pickedCode);
  return (
    <section aria-labelledby="route-h">
      <h2 id="route-h">Today&apos;s route ({route.length})</h2>
      {route.length === 0 ? (
        <p className="muted">No source is due today.</p>
      ) : (
        <ul className="collect-route">
          {route
            .filter((stop) => showAll || !pickedOnRoute || stop.code === pickedCode)
            .map((stop) => {
              const s = sourcesByCode.get(stop.code);
              const picked = pickedCode === stop.code;
              return (
                <li key={stop.code}>
                  <button
                    type="button"
                    className={picked ? "collect-stop picked" : "collect-stop"}
                    aria-pressed={picked}
                    onClick={() => onPick(stop.code)}
                  >
                    <span className="collect-stop-name">{s?.name ?? stop.code}</span>
                    <span className="collect-stop-meta">
                      {stop.code} · {dueText(stop)}
                      {s?.collectorNote ? " · note" : ""}
                    </span>
                  </button>
                </li>
              );
            })}
        </ul>
      )}
      {pickedOnRoute && !showAll && route.length > 1 ? (
        <button type="button" className="collect-secondary collect-wide" onClick={onShowAll}>
          Show all {route.length} stops
        </button>
      ) : null}
    </section>
  );
}
