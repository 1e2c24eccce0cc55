import { POSITION_FIELDS } from "@/lib/uploads/parse-positions";
import { assetClassTable, POSITION_COLUMN_GUIDE } from "@/lib/uploads/position-guide";
import { POSITION_ATTRIBUTE_GUIDE } from "@/lib/uploads/position-attributes";
import { SimpleTable } from "@/app/_components/simple-table";

/** The positions file's columns (meaning, unit, allowed values, example) and the accepted asset-class spellings. */
export function PositionColumnGuide({ reportingCurrency }: { reportingCurrency: string }) {
  const described = new Set<string>(POSITION_COLUMN_GUIDE.map((g) => g.field));
  const others = Object.entries(POSITION_FIELDS).filter(([key]) => !described.has(key));
  return (
    <section aria-labelledby="columns-heading" className="mt-8" data-testid="column-guide">
      <h2 id="columns-heading" className="mb-1 text-lg font-semibold">
        Positions file: the columns
      </h2>
      <p className="mb-3 text-sm text-ink-soft">
        The template holds this header and one example row (replace it). Header names are matched without case, spaces or underscores; the
        reporting currency of this firm is {reportingCurrency}.
      </p>
      <SimpleTable caption="Columns of the positions file" columns={["Column", "Meaning", "Unit", "Allowed", "Example"]}>
        {POSITION_COLUMN_GUIDE.map((g) => (
          <tr key={g.field} className="border-t border-ink-line align-top" data-testid="column-guide-row">
            <th scope="row" className="px-3 py-2 text-left font-normal whitespace-nowrap">
              <code className="font-medium">{g.column}</code>
              <span className="block text-xs text-ink-muted">{g.required ? "required" : "optional"}</span>
            </th>
            <td className="px-3 py-2">{g.meaning}</td>
            <td className="px-3 py-2">{g.unit.replace("reporting currency", `reporting currency (${reportingCurrency})`)}</td>
            <td className="px-3 py-2">{g.allowed}</td>
            <td className="px-3 py-2 whitespace-nowrap">
              <code>{g.example || "(empty)"}</code>
            </td>
          </tr>
        ))}
      </SimpleTable>
      {others.length > POSITION_ATTRIBUTE_GUIDE.length ? (
        <p className="mt-2 text-sm text-ink-soft">
          Also read when present: {others.filter(([key]) => !POSITION_ATTRIBUTE_GUIDE.some((g) => g.field === key)).map(([, f]) => f.label).join(", ")}.
        </p>
      ) : null}
      <h3 id="standardised-columns-heading" className="mt-6 mb-1 font-semibold">
        Optional columns for the standardised capital figure
      </h3>
      <p className="mb-2 text-sm text-ink-soft">
        Needed only when the firm&apos;s capital rule profile files the standardised figure, and then only by the instruments that use them: the
        upload names each row and column a position lacks, before confirmation.
      </p>
      <SimpleTable labelledBy="standardised-columns-heading" testId="standardised-column-guide" columns={["Column", "Meaning", "Unit", "Allowed"]}>
        {POSITION_ATTRIBUTE_GUIDE.map((g) => (
          <tr key={g.field} className="border-t border-ink-line align-top">
            <th scope="row" className="px-3 py-2 text-left font-normal whitespace-nowrap">
              <code className="font-medium">{g.column}</code>
            </th>
            <td className="px-3 py-2">{g.meaning}</td>
            <td className="px-3 py-2">{g.unit.replace("reporting currency", `reporting currency (${reportingCurrency})`)}</td>
            <td className="px-3 py-2">{g.allowed}</td>
          </tr>
        ))}
      </SimpleTable>

      <h3 id="asset-classes-heading" className="mt-6 mb-1 font-semibold">
        Asset classes and the spellings accepted
      </h3>
      <p className="mb-2 text-sm text-ink-soft">
        The file&apos;s <code>asset_class</code> may use any spelling below (case, spaces, hyphens and underscores do not matter). A bare
        &ldquo;bond&rdquo; is read as a corporate bond; write &ldquo;government bond&rdquo; for a sovereign issuer.
      </p>
      <SimpleTable labelledBy="asset-classes-heading" columns={["Asset class", "Spellings accepted"]}>
        {assetClassTable().map((row) => (
          <tr key={row.assetClass} className="border-t border-ink-line" data-testid="asset-class-row">
            <th scope="row" className="px-3 py-1.5 text-left font-normal">
              <code className="font-medium">{row.assetClass}</code> <span className="text-ink-muted">{row.label}</span>
            </th>
            <td className="px-3 py-1.5">{[row.assetClass, ...row.spellings.filter((s) => s !== row.assetClass)].join(", ")}</td>
          </tr>
        ))}
      </SimpleTable>
    </section>
  );
}
