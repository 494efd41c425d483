import type { ReactNode } from "react";
import { FFA_BASES } from "@/lib/titration/titration";
import type { FfaBasis } from "@/lib/titration/titration";

export type TitrationValues = Record<
  "sampleMassG" | "titrant" | "concentrationMolL" | "titreMl" | "blankMl" | "basis",
  string
>;

export const START: TitrationValues = {
  sampleMassG: "",
  titrant: "NAOH",
  concentrationMolL: "",
  titreMl: "",
  blankMl: "0",
  basis: "OLEIC",
};

const BASIS_LABEL: Record<FfaBasis, string> = {
  OLEIC: "Oleic acid",
  PALMITIC: "Palmitic acid (palm oil)",
  LAURIC: "Lauric acid (coconut, palm kernel)",
};

type Name = keyof TitrationValues;

function Labelled({
  name,
  label,
  error,
  children,
}: {
  name: Name;
  label: string;
  error?: string;
  children: ReactNode;
}) {
  return (
    <div className="field">
      <label>
        {label}
        {children}
      </label>
      {error ? (
        <span className="field-error" id={`t-${name}-err`}>
          {error}
        </span>
      ) : null}
    </div>
  );
}

/** The readings as the lab takes them: sample, titrant and its strength, titre, blank, and the FFA basis. */
export function TitrationFields({
  values,
  errors,
  onChange,
}: {
  values: TitrationValues;
  errors: Partial<Record<Name, string>>;
  onChange: (name: Name, value: string) => void;
}) {
  const props = (name: Name) => ({
    name,
    value: values[name],
    onChange: (e: { target: { value: string } }) => onChange(name, e.target.value),
    "aria-invalid": errors[name] ? true : undefined,
    "aria-describedby": errors[name] ? `t-${name}-err` : undefined,
  });
  const num = (name: Name, label: string) => (
    <Labelled name={name} label={label} error={errors[name]}>
      <input inputMode="decimal" autoComplete="off" {...props(name)} />
    </Labelled>
  );
  return (
    <div className="lab-grid">
      {num("sampleMassG", "Sample mass (g)")}
      <Labelled name="titrant" label="Titrant" error={errors.titrant}>
        <select {...props("titrant")}>
          <option value="NAOH">NaOH (sodium hydroxide)</option>
          <option value="KOH">KOH (potassium hydroxide)</option>
        </select>
      </Labelled>
      {num("concentrationMolL", "Titrant concentration (mol/L)")}
      {num("titreMl", "Titre (mL)")}
      {num("blankMl", "Blank (mL)")}
      <Labelled name="basis" label="FFA expressed as" error={errors.basis}>
        <select {...props("basis")}>
          {FFA_BASES.map((b) => (
            <option key={b} value={b}>
              {BASIS_LABEL[b]}
            </option>
          ))}
        </select>
      </Labelled>
    </div>
  );
}
