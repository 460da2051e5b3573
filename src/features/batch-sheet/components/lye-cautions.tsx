import type { LyeCautions as Cautions } from '@shared/domain/lye/lye'

/** The GHS frame: a red diamond, as on a sodium hydroxide label. The code beside it names it. */
function Diamond() {
  return (
    <svg aria-hidden="true" viewBox="0 0 52 52" className="size-12 shrink-0">
      <path
        d="M26 2 50 26 26 50 2 26Z"
        fill="#fff"
        stroke="#c4161c"
        strokeWidth="3.5"
        strokeLinejoin="round"
      />
      <text x="26" y="30" textAnchor="middle" fontSize="9" fontWeight="700" fill="#2d2a26">
        GHS05
      </text>
    </svg>
  )
}

/** The usual cautions for sodium hydroxide, shown wherever the product says how much lye to weigh. */
export function LyeCautions({ cautions, lyeName }: { cautions: Cautions; lyeName: string }) {
  return (
    <section
      aria-labelledby="lye-cautions-title"
      className="rounded-card border border-clay-300 bg-clay-50 px-4 py-4 sm:px-5 print:break-inside-avoid"
    >
      <div className="flex items-start gap-3">
        <Diamond />
        <div className="min-w-0">
          <h3 id="lye-cautions-title" className="text-base font-medium text-clay-700">
            {cautions.signalWord}: {lyeName} is corrosive ({cautions.pictogram})
          </h3>
          <ul className="mt-1 text-sm text-ink-800">
            {cautions.hazards.map((h) => (
              <li key={h.code}>
                <span className="font-medium">{h.code}</span> {h.text}
              </li>
            ))}
          </ul>
        </div>
      </div>
      <ul className="mt-3 grid gap-1 text-sm text-ink-800 sm:grid-cols-2">
        {cautions.precautions.map((p) => (
          <li key={p.code}>
            <span className="font-medium">{p.code}</span> {p.text}
          </li>
        ))}
      </ul>
      {cautions.practice.map((p) => (
        <p key={p} className="mt-3 text-sm font-medium text-ink-900">
          {p}
        </p>
      ))}
      <p className="mt-2 text-sm text-ink-700 italic">{cautions.disclaimer}</p>
    </section>
  )
}
