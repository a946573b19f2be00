import { CAUTIONS } from '@/lib/domain/correction/cautions';

/** The cautions, shown where a plan is chosen; never folded away. */
export function Cautions() {
  return (
    <section aria-labelledby="cautions-h" className="card border-l-4 border-l-ink p-3 text-sm">
      <h2 id="cautions-h" className="mb-1">⚠ Cautions before any capacitor work</h2>
      <p className="mb-2 text-muted">These figures support a decision; they are not a design. Local electrical codes, the utility’s rules and a licensed engineer’s design take precedence over anything shown here.</p>
      <ul className="flex flex-col gap-1.5">
        {CAUTIONS.map((c) => (
          <li key={c.id} data-caution={c.id}><span className="font-medium">{c.title}.</span> {c.text}</li>
        ))}
      </ul>
    </section>
  );
}
