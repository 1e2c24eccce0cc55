/** A bulleted list of sentences (notes, warnings, limitations, reasons) in the list style the caller gives. */
export function Bullets({ items, className, testId }: { items: string[]; className: string; testId?: string }) {
  return (
    <ul className={className} data-testid={testId}>
      {items.map((item, i) => (
        <li key={i}>{item}</li>
      ))}
    </ul>
  );
}
