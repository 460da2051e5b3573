import type { PackingOrderDto, PickListDto } from '@shared/schemas/packing'
import { renderPdf } from '@server/lib/pdf'
import { studioToday } from '@server/modules/availability/availability.service'
import { getSettings } from '@server/modules/settings/settings.service'
import { packingSlipDocument } from '@templates/pdf/packing-slip'
import { pickListDocument } from '@templates/pdf/pick-list'

/** The packing slip PDF: the one the bench prints and the one the shipping e-mail attaches. */
export async function renderPackingSlipPdf(order: PackingOrderDto): Promise<Buffer> {
  const [settings, today] = await Promise.all([getSettings(), studioToday()])
  return renderPdf(packingSlipDocument({ studio: settings.studio, order, printedOn: today }))
}

export async function renderPickListPdf(list: PickListDto): Promise<Buffer> {
  const [settings, today] = await Promise.all([getSettings(), studioToday()])
  return renderPdf(pickListDocument({ studio: settings.studio, list, printedOn: today }))
}

export const packingSlipFilename = (order: Pick<PackingOrderDto, 'number'>) =>
  `packing-slip-${order.number}.pdf`
