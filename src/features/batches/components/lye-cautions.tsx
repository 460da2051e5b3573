import { LYE_CAUTIONS } from '@shared/domain/lye/lye'

/** The usual cautions wherever the product says how much sodium hydroxide to weigh. */
export function LyeCautions() {
  const c = LYE_CAUTIONS
  return (
    <section
      aria-label="Handling lye"
      className="rounded-md border border-clay-300 bg-clay-50 px-4 py-3 text-sm text-ink-800"
    >
      <p className="font-medium text-clay-700">
        {c.signalWord} ({c.pictogram}): sodium hydroxide is caustic.
      </p>
      <ul className="mt-1 list-disc pl-5">
        {c.hazards.map((h) => (
          <li key={h.code}>
            {h.code} {h.text}
          </li>
        ))}
        {c.precautions.map((p) => (
          <li key={p.code}>
            {p.code} {p.text}
          </li>
        ))}
        {c.practice.map((p) => (
          <li key={p}>{p}</li>
        ))}
      </ul>
      <p className="mt-2 text-ink-700">{c.disclaimer}</p>
    </section>
  )
}
