import { DOCUMENT_STATUS_LABELS } from '@shared/schemas/invoices'
import type { DocumentStatus } from '@shared/schemas/invoices'
import { Badge } from '@/components/ui/badge'
import type { BadgeTone } from '@/components/ui/badge'

const TONE: Record<DocumentStatus, BadgeTone> = {
  open: 'sky',
  part_paid: 'honey',
  paid: 'green',
  overdue: 'clay',
  void: 'neutral',
  credit: 'neutral',
}

export function InvoiceStatusBadge({ status }: { status: DocumentStatus }) {
  return <Badge tone={TONE[status]}>{DOCUMENT_STATUS_LABELS[status]}</Badge>
}
