/** Short lab cautions at the step they concern; they point to the SDS and the lab's own procedures. */
export function LabCautions({ kind }: { kind: "titration" | "tests" }) {
  return (
    <aside className="cautions" aria-label="Cautions">
      <p className="cautions-title">Cautions</p>
      <ul>
        {kind === "titration" ? (
          <>
            <li>The titration alcohol (ethanol or isopropanol) is flammable: warm it on a hot plate or water bath, never over a flame.</li>
            <li>Sodium and potassium hydroxide titrants are corrosive, more so in alcohol: eye protection and gloves.</li>
          </>
        ) : (
          <li>Karl Fischer reagents are toxic and flammable; use them in a fume hood.</li>
        )}
        <li>Samples of melted fat or hot oil burn: let them cool to the method&apos;s temperature before weighing.</li>
        <li>Work to the safety data sheets and the lab&apos;s own procedures.</li>
      </ul>
    </aside>
  );
}
