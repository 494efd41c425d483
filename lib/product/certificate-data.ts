// The certificate of analysis as plain data: what the product lot page shows in its QC table and what
// the PDF prints. Built by buildCertificate (certificate.ts); rendered by the page and certificate-pdf.ts.

export type CertificateVerdict = "PASS" | "FAIL" | "REPORTED" | "NOT_JUDGED" | "MISSING";

export interface CertificateRow {
  /** The specification's property key (for links and tests; never printed). */
  key: string;
  property: string;
  method: string;
  /** The limit as the specification states it, in words ("0.50 max", "1.9 to 6.0", "report"). */
  limit: string;
  /** The latest result as text, "" when missing. */
  result: string;
  unit: string;
  verdict: CertificateVerdict;
  verdictText: string;
  required: boolean;
  testedAt: Date | null;
  lab: string;
  reportNo: string;
}

export interface CertificateRule {
  label: string;
  met: boolean;
  text: string;
}

export interface CertificateData {
  plant: { name: string; town: string };
  lot: { code: string; batchCode: string | null; producedAt: Date; massKg: number };
  /** One line naming the specification: title, edition and grade, or site spec name, version and base. */
  specText: string;
  rows: CertificateRow[];
  rules: CertificateRule[];
  /** Labels of required properties without a result. */
  missing: string[];
  /** Labels of properties whose latest result is out of limits. */
  failing: string[];
  /** Judged afresh against the current specification: every required result present and passing, every either-or rule met. */
  releasable: boolean;
  decision: {
    status: "HELD" | "RELEASED" | "REJECTED";
    statusText: string;
    by: string | null;
    at: Date | null;
    deviation: boolean;
    reason: string;
  };
  released: boolean;
  generatedAt: Date;
  timeZone: string;
}
