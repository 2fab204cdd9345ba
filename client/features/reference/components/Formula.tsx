/** A chemical formula with its counts as subscripts; the coefficient after a hydrate dot stays full size. */
export function Formula({ formula }: { formula: string }) {
  const parts = formula.split(/([·.])/);
  return (
    <span className="font-mono whitespace-nowrap" aria-label={formula}>
      {parts.map((part, i) => {
        if (part === '·' || part === '.') return <span key={i}>·</span>;
        const lead = /^\d+/.exec(part)?.[0] ?? '';
        const tokens = part.slice(lead.length).split(/(\d+)/);
        return (
          <span key={i}>
            {lead}
            {tokens.map((t, j) => (/^\d+$/.test(t) ? <sub key={j}>{t}</sub> : t))}
          </span>
        );
      })}
    </span>
  );
}
