"use client";
import { useEffect, useRef, useState } from "react";
import { readScanned } from "@/lib/labels/label-range";

// The Shape Detection API's BarcodeDetector is not in TypeScript's DOM library yet.
interface DetectedCode {
  rawValue: string;
}
interface BarcodeDetectorLike {
  detect(source: CanvasImageSource): Promise<DetectedCode[]>;
}
type BarcodeDetectorCtor = new (opts?: { formats?: string[] }) => BarcodeDetectorLike;

function detectorCtor(): BarcodeDetectorCtor | null {
  const g = globalThis as unknown as { BarcodeDetector?: BarcodeDetectorCtor };
  return typeof g.BarcodeDetector === "function" ? g.BarcodeDetector : null;
}

/** "Scan" where the browser has BarcodeDetector and a camera; the typed-number box below always works. */
export function Scanner() {
  const [canScan, setCanScan] = useState(false);
  const [scanning, setScanning] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const camera = useRef<HTMLVideoElement>(null);
  const stream = useRef<MediaStream | null>(null);

  useEffect(() => {
    setCanScan(detectorCtor() !== null && !!navigator.mediaDevices?.getUserMedia);
    return () => stream.current?.getTracks().forEach((t) => t.stop());
  }, []);

  function open(text: string) {
    const r = readScanned(text, window.location.origin);
    if (r === null) return setMessage(`This code is not one of this app's labels: ${text}`);
    window.location.assign("path" in r ? r.path : `/labels/find?number=${encodeURIComponent(r.code)}`);
  }

  async function start() {
    const Ctor = detectorCtor();
    if (!Ctor) return;
    setMessage(null);
    try {
      const detector = new Ctor({ formats: ["qr_code", "code_128", "data_matrix"] });
      stream.current = await navigator.mediaDevices.getUserMedia({ video: { facingMode: "environment" } });
      const v = camera.current;
      if (!v) return;
      v.srcObject = stream.current;
      // Not awaited: a camera that is slow to deliver its first frame must not hold the loop up.
      void v.play().catch(() => undefined);
      setScanning(true);
      const tick = async () => {
        if (!stream.current) return;
        try {
          const found = await detector.detect(v);
          const first = found[0]?.rawValue;
          if (first) {
            stop();
            return open(first);
          }
        } catch {
          /* a frame that cannot be read; try the next */
        }
        window.setTimeout(() => void tick(), 250);
      };
      void tick();
    } catch (e) {
      setMessage(
        `The camera could not be opened (${e instanceof Error ? e.message : String(e)}). Type the number instead.`,
      );
      stop();
    }
  }

  function stop() {
    stream.current?.getTracks().forEach((t) => t.stop());
    stream.current = null;
    setScanning(false);
  }

  return (
    <div>
      {canScan ? (
        <p>
          <button type="button" className="primary" onClick={() => (scanning ? stop() : void start())}>
            {scanning ? "Stop the camera" : "Scan"}
          </button>
        </p>
      ) : (
        <p className="muted">This browser cannot read barcodes with the camera; type the number below.</p>
      )}
      <video ref={camera} className="scan-camera" hidden={!scanning} muted playsInline />
      {message ? (
        <p className="form-error" role="alert">
          {message}
        </p>
      ) : null}
    </div>
  );
}
