"use client";
import { useEffect, useState } from "react";
import { haversineMetres } from "@/lib/screening/geo";
import { distanceBandOf } from "@/lib/screening/pattern-signals";
import type { DistanceBand } from "@/lib/core/vocabulary";

const CONSENT_KEY = "tracevat.shareDistance";
/** "unknown" until the stored answer is read after the page is on screen; null when never asked. */
type Consent = "yes" | "no" | null | "unknown";

/**
 * Asks once whether the phone may tell how far it is from each stop. Only a distance band goes with the
 * pickup (worked out on the phone); the position itself is never stored or sent.
 */
export function useDistanceBand(): {
  consent: Consent;
  answer: (yes: boolean) => void;
  bandFor: (stop: { lat: number; lon: number } | null) => Promise<DistanceBand | undefined>;
} {
  const [consent, setConsent] = useState<Consent>("unknown");
  useEffect(() => {
    const v = window.localStorage.getItem(CONSENT_KEY);
    setConsent(v === "yes" || v === "no" ? v : null);
  }, []);
  const answer = (yes: boolean) => {
    window.localStorage.setItem(CONSENT_KEY, yes ? "yes" : "no");
    setConsent(yes ? "yes" : "no");
    // The browser asks its own permission now, once, rather than in the middle of a pickup.
    if (yes)
      navigator.geolocation?.getCurrentPosition(
        () => undefined,
        () => undefined,
        { timeout: 10_000 },
      );
  };
  const bandFor = (stop: { lat: number; lon: number } | null) =>
    new Promise<DistanceBand | undefined>((resolve) => {
      if (consent !== "yes" || stop === null || !("geolocation" in navigator)) return resolve(undefined);
      navigator.geolocation.getCurrentPosition(
        (p) => resolve(distanceBandOf(haversineMetres(stop, { lat: p.coords.latitude, lon: p.coords.longitude }))),
        () => resolve(undefined),
        { timeout: 4_000, maximumAge: 120_000, enableHighAccuracy: false },
      );
    });
  return { consent, answer, bandFor };
}

export function DistanceQuestion({ consent, answer }: { consent: Consent; answer: (yes: boolean) => void }) {
  if (consent !== null) return null;
  return (
    <div className="collect-small" role="group" aria-label="Distance from the stop">
      <p>
        May this phone note how far it is from each stop? Only a rough distance (for example &ldquo;within 250 m&rdquo;)
        is kept with the pickup, never where you went.
      </p>
      <button type="button" onClick={() => answer(true)}>
        Share distance
      </button>{" "}
      <button type="button" onClick={() => answer(false)}>
        Don&apos;t share
      </button>
    </div>
  );
}
