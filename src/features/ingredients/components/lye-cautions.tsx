import { LYE_CAUTIONS } from '@shared/domain/lye/lye'
import { Card, CardBody, CardHeader } from '@/components/ui/card'

/** The usual hazard and precaution statements for sodium hydroxide, shown with a lye ingredient. */
export function LyeCautions() {
  const c = LYE_CAUTIONS
  return (
    <Card className="ring-clay-300">
      <CardHeader
        title={`${c.signalWord}: corrosive (${c.pictogram})`}
        as="h2"
        description="Handling lye. The studio’s own safety assessment, local rules and licensed advice decide."
      />
      <CardBody className="grid gap-4 text-sm sm:grid-cols-2">
        <div>
          <h3 className="mb-1 font-medium text-ink-900">Hazards</h3>
          <ul className="flex flex-col gap-1">
            {c.hazards.map((h) => (
              <li key={h.code}>
                <span className="font-medium">{h.code}</span> {h.text}
              </li>
            ))}
          </ul>
        </div>
        <div>
          <h3 className="mb-1 font-medium text-ink-900">Precautions</h3>
          <ul className="flex flex-col gap-1">
            {c.precautions.map((p) => (
              <li key={p.code}>
                <span className="font-medium">{p.code}</span> {p.text}
              </li>
            ))}
            {c.practice.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        </div>
      </CardBody>
    </Card>
  )
}
