import QRCode from "qrcode";
import { gs1LotElement } from "@/lib/labels/gs1";
import { labelOf } from "@/lib/ledger/kinds";
import type { LotForLabel } from "@/lib/labels/labels.store";
import { day, kg } from "@/app/_ui/format";

/** QR code as SVG made on the server by the `qrcode` package; the text is our own record URL. */
async function QrSvg({ url, label }: { url: string; label: string }) {
  const svg = await QRCode.toString(url, { type: "svg", errorCorrectionLevel: "M", margin: 1 });
  return <div className="label-qr" role="img" aria-label={label} dangerouslySetInnerHTML={{ __html: svg }} />;
}

export async function LotLabel({ lot, origin, siteName, timeZone, single = false }: { lot: LotForLabel; origin: string; siteName: string; timeZone: string; single?: boolean }) {
  const url = `${origin}/lots/${encodeURIComponent(lot.code)}`;
  const gs1 = gs1LotElement(lot.code);
  return (
    <div className={single ? "label-card single" : "label-card"} data-label={lot.code}>
      <QrSvg url={url} label={`QR code opening lot ${lot.code}`} />
      <div className="label-text">
        <div className="label-code">Lot {lot.code}</div>
        {gs1.ok ? <div className="label-gs1">{gs1.value.elementString}</div> : <div className="label-gs1">no GS1 form: {gs1.issues[0]?.message}</div>}
        <div>
          {labelOf(lot.material)} · {kg(lot.massG, 0)}
        </div>
        <div>
          received {day(lot.receivedAt, timeZone)}
          {lot.certified ? " · certified" : ""}
        </div>
        <div className="muted">{siteName}</div>
      </div>
    </div>
  );
}

export async function ContainerLabel({ tag, origin, siteName, single = false }: { tag: string; origin: string; siteName: string; single?: boolean }) {
  const url = `${origin}/labels/container/${encodeURIComponent(tag)}`;
  return (
    <div className={single ? "label-card single" : "label-card"} data-label={tag}>
      <QrSvg url={url} label={`QR code opening container ${tag}`} />
      <div className="label-text">
        <div className="label-code">{tag}</div>
        <div>Used-oil container</div>
        <div className="muted">{siteName}</div>
        <div className="muted">Scan or type the number to see its pickups</div>
      </div>
    </div>
  );
}
