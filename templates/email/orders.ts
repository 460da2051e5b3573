import { formatDate } from '@shared/domain/dates/dates'
import { formatCents } from '@shared/domain/money/money'
import type { OrderDto } from '@shared/schemas/orders'
import { renderEmail } from './layout'
import type { Email, EmailBlock } from './layout'

type Common = { studioName: string; name: string; order: OrderDto; link: string; currency: string }

function money(cents: number | undefined, currency: string) {
  return formatCents(cents ?? 0, currency)
}

function lineItems(order: OrderDto, currency: string, only?: ReadonlySet<number>): string[] {
  return order.lines
    .filter((l) => !only || only.has(l.id))
    .map((l) => {
      const cases = `${l.cases} ${l.cases === 1 ? 'case' : 'cases'}`
      const when = l.preorder
        ? l.allocations.length > 0
          ? ' — pre-order, set aside'
          : ` — pre-order, promised for ${formatDate(l.promisedDate!)}`
        : ''
      return `${cases} of ${l.name} (${l.sku}), ${l.bars} bars: ${money(l.lineTotalCents, currency)}${when}`
    })
}

function totals(order: OrderDto, currency: string): EmailBlock {
  return {
    kind: 'list',
    items: [
      `Merchandise: ${money(order.subtotalCents, currency)}`,
      `Shipping: ${money(order.shippingCents, currency)}`,
      order.taxExempt
        ? 'Tax: exempt (resale certificate on file)'
        : `Tax: ${money(order.taxCents, currency)}`,
      `Total: ${money(order.totalCents, currency)}`,
    ],
  }
}

const po = (order: OrderDto) => (order.poNumber ? ` (your PO ${order.poNumber})` : '')

/** To the buyer who placed it. */
export function orderPlacedEmail(p: Common): Email {
  const waiting = p.order.lines.some((l) => l.preorder)
  return renderEmail({
    subject: `Order ${p.order.number} placed with ${p.studioName}${p.order.status === 'confirmed' ? ' and confirmed' : ''}`,
    studioName: p.studioName,
    greeting: `Hello ${p.name},`,
    blocks: [
      {
        kind: 'p',
        text: `Thank you: order ${p.order.number}${po(p.order)} for ${p.order.shopName} is placed. The bars for it are set aside from cured stock${waiting ? ', and the pre-order lines will be set aside the day their batch finishes curing' : ''}.`,
      },
      { kind: 'list', items: lineItems(p.order, p.currency) },
      totals(p.order, p.currency),
      { kind: 'button', text: 'See the order', href: p.link },
      {
        kind: 'small',
        text:
          p.order.status === 'confirmed'
            ? 'The studio has confirmed it already; you will hear from us again when it ships.'
            : 'The studio confirms it shortly. Until then you can still cancel it from the order page.',
      },
    ],
  })
}

/** To the studio's owners. */
export function orderPlacedStudioEmail(p: Common): Email {
  return renderEmail({
    subject: `Order ${p.order.number} placed by ${p.order.shopName}`,
    studioName: p.studioName,
    greeting: `Hello ${p.name},`,
    blocks: [
      {
        kind: 'p',
        text: `${p.order.shopName} placed order ${p.order.number}${p.order.poNumber ? ` with PO ${p.order.poNumber}` : ''}${p.order.isOpeningOrder ? ', their opening order' : ''}.`,
      },
      { kind: 'list', items: lineItems(p.order, p.currency) },
      totals(p.order, p.currency),
      ...(p.order.note ? [{ kind: 'p' as const, text: `Their note: ${p.order.note}` }] : []),
      {
        kind: 'button',
        text: p.order.status === 'placed' ? 'Review and confirm' : 'Open the order',
        href: p.link,
      },
    ],
  })
}

export function orderConfirmedEmail(p: Common): Email {
  return renderEmail({
    subject: `Order ${p.order.number} confirmed`,
    studioName: p.studioName,
    greeting: `Hello ${p.name},`,
    blocks: [
      {
        kind: 'p',
        text: `${p.studioName} has confirmed order ${p.order.number}${po(p.order)}. It goes to packing next.`,
      },
      { kind: 'list', items: lineItems(p.order, p.currency) },
      { kind: 'button', text: 'See the order', href: p.link },
    ],
  })
}

export function orderCancelledEmail(p: Common & { byStudio: boolean }): Email {
  return renderEmail({
    subject: `Order ${p.order.number} cancelled`,
    studioName: p.studioName,
    greeting: `Hello ${p.name},`,
    blocks: [
      {
        kind: 'p',
        text: p.byStudio
          ? `${p.studioName} has cancelled order ${p.order.number}${po(p.order)} for ${p.order.shopName}.`
          : `${p.order.shopName} cancelled order ${p.order.number}${po(p.order)}.`,
      },
      ...(p.order.cancelReason ? [{ kind: 'p' as const, text: `Reason: ${p.order.cancelReason}` }] : []),
      { kind: 'p', text: 'Nothing will be packed or invoiced for it; its bars are back in stock.' },
      { kind: 'button', text: 'See the order', href: p.link },
    ],
  })
}

export function preorderAllocatedEmail(p: Common & { lineIds: ReadonlySet<number> }): Email {
  return renderEmail({
    subject: `Pre-order bars set aside for order ${p.order.number}`,
    studioName: p.studioName,
    greeting: `Hello ${p.name},`,
    blocks: [
      {
        kind: 'p',
        text: `The batch you pre-ordered from has finished curing. These bars on order ${p.order.number}${po(p.order)} are now set aside for you:`,
      },
      { kind: 'list', items: lineItems(p.order, p.currency, p.lineIds) },
      { kind: 'button', text: 'See the order', href: p.link },
    ],
  })
}
