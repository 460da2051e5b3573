/**
 * A prepay account's order is invoiced at confirmation and ships only once that invoice is paid in
 * full. The rule is the invoice's own terms (the shop's terms may have changed since), so an order
 * invoiced on net terms never waits here.
 *
 * A SQL condition, true when the order whose id is the expression `orderId` has a live prepay
 * invoice with something still owing. Read paths (the packing bench, the owner's order) and the
 * shipment's check use the same words.
 */
export function awaitingPaymentSql(orderId: string) {
  return `EXISTS (SELECT 1 FROM invoices ap
                   WHERE ap.order_id = ${orderId} AND ap.kind = 'invoice' AND ap.voided_at IS NULL
                     AND ap.terms = 'prepay' AND ap.paid_cents < ap.total_cents)`
}
