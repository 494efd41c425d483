import QRCode from "qrcode";
import { gs1LabelElementString } from "@/lib/labels/gs1";
import { gs1DataMatrixSvg } from "@/lib/labels/gs1-symbol";
import { gtinFor, isGs1CompanyPrefix } from "@/lib/epcis/identifiers";
import { labelOf } from "@/lib/core/vocabulary";
import type { LotForLabel } from "@/lib/labels/labels.store";
import { day, kg } from "@/app/_ui/format";

/** QR code as SVG made on the server by the `qrcode` package; the text is our own record URL. */
async function QrSvg({ url, label }: { url: string; label: string }) {
  const svg = await QRCode.toString(url, { type: "svg", errorCorrectionLevel: "M", margin: 1 });
  return <div className="label-qr" role="img" aria-label={label} dangerouslySetInnerHTML={{ __html: svg }} />;
}

/** GS1 DataMatrix drawn on the server by bwip-js; the element string is printed under it as text. */
function Gs1Symbol({ elementString, withGtin, lot }: { elementString: string; withGtin: boolean; lot: string }) {
  return (
    <div
      className="label-datamatrix"
      role="img"
      aria-label={`GS1 DataMatrix carrying lot ${lot}`}
      data-element-string={elementString}
      dangerouslySetInnerHTML={{ __html: gs1DataMatrixSvg(elementString, withGtin) }}
    />
  );
}

export async function LotLabel({
  lot,
  origin,
  siteName,
  timeZone,
  gs1CompanyPrefix,
  single = false,
}: {
  lot: LotForLabel;
  origin: string;
  siteName: string;
  timeZone: string;
  gs1CompanyPrefix: string | null;
  single?: boolean;
}) {
  const url = `${origin}/lots/${encodeURIComponent(lot.code)}`;
  const gtin =
    gs1CompanyPrefix !== null && isGs1CompanyPrefix(gs1CompanyPrefix) ? gtinFor(gs1CompanyPrefix, lot.material) : null;
  const gs1 = gs1LabelElementString(lot.code, gtin);
  return (
    <div className={single ? "label-card single" : "label-card"} data-label={lot.code}>
      <div className="label-symbols">
        <QrSvg url={url} label={`QR code opening lot ${lot.code}`} />
        {gs1.ok ? (
          <Gs1Symbol elementString={gs1.value.elementString} withGtin={gs1.value.withGtin} lot={lot.code} />
        ) : null}
      </div>
      <div className="label-text">
        <div className="label-code">Lot {lot.code}</div>
        {gs1.ok ? (
          <div className="label-gs1">
            {gs1.value.elementString.split(/(?=\()/).map((part, i) => (
              <span key={i}>
                {i > 0 ? <wbr /> : null}
                {part}
              </span>
            ))}
          </div>
        ) : (
          <div className="label-gs1">no GS1 barcode: {gs1.issues[0]?.message}</div>
        )}
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

export async function ContainerLabel({
  tag,
  origin,
  siteName,
  single = false,
}: {
  tag: string;
  origin: string;
  siteName: string;
  single?: boolean;
}) {
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
