import { renderEmail } from './layout'
import type { Email } from './layout'

type ApplicationFacts = {
  tradingName: string
  legalName: string
  contactName: string
  contactEmail: string
  contactPhone: string
  storeType: string
  city: string
  region: string
}

/** To the studio's owners: an application is waiting. */
export function newApplicationEmail(p: {
  studioName: string
  application: ApplicationFacts
  link: string
}): Email {
  const a = p.application
  return renderEmail({
    subject: `New wholesale application: ${a.tradingName}`,
    studioName: p.studioName,
    greeting: 'Hello,',
    blocks: [
      { kind: 'p', text: `${a.tradingName} (${a.legalName}) has applied for a wholesale account.` },
      {
        kind: 'list',
        items: [
          `Contact: ${a.contactName}, ${a.contactEmail}, ${a.contactPhone}`,
          `Store: ${a.storeType} in ${a.city}, ${a.region}`,
          'Resale certificate: attached to the application',
        ],
      },
      { kind: 'button', text: 'Review the application', href: p.link },
      { kind: 'small', text: 'Approve it with a price tier and payment terms, or decline it with a reason.' },
    ],
  })
}

/** To the applicant: the application arrived. */
export function applicationReceivedEmail(p: {
  studioName: string
  contactName: string
  tradingName: string
}): Email {
  return renderEmail({
    subject: `We received your application to ${p.studioName}`,
    studioName: p.studioName,
    greeting: `Hello ${p.contactName},`,
    blocks: [
      {
        kind: 'p',
        text: `Thank you for applying for a wholesale account for ${p.tradingName}. We received your application and your resale certificate.`,
      },
      {
        kind: 'p',
        text: 'We read every application ourselves. When your account is open, you will get an e-mail with a link to set your password and start ordering by the case.',
      },
      { kind: 'small', text: 'You did not apply? Ignore this e-mail; nothing happens without us.' },
    ],
  })
}

/** To the applicant: declined, with the owner's reason. */
export function applicationDeclinedEmail(p: {
  studioName: string
  contactName: string
  tradingName: string
  reason: string
}): Email {
  return renderEmail({
    subject: `Your wholesale application to ${p.studioName}`,
    studioName: p.studioName,
    greeting: `Hello ${p.contactName},`,
    blocks: [
      {
        kind: 'p',
        text: `Thank you for your interest in stocking our soap at ${p.tradingName}. We are not able to open a wholesale account at this time.`,
      },
      { kind: 'p', text: `Our reason: ${p.reason}` },
      {
        kind: 'small',
        text: 'If something has changed, reply to this e-mail and we will gladly look again.',
      },
    ],
  })
}

/** To the applicant's contact when the first buyer is someone else: the account is open. */
export function accountOpenedEmail(p: {
  studioName: string
  contactName: string
  tradingName: string
  buyerName: string
  buyerEmail: string
}): Email {
  return renderEmail({
    subject: `Your wholesale account with ${p.studioName} is open`,
    studioName: p.studioName,
    greeting: `Hello ${p.contactName},`,
    blocks: [
      { kind: 'p', text: `We approved the wholesale account for ${p.tradingName}.` },
      {
        kind: 'p',
        text: `${p.buyerName} (${p.buyerEmail}) has been invited to order for the shop and will receive a link to set a password.`,
      },
    ],
  })
}

/** To the owners: a buyer sent a renewed resale certificate. */
export function certificateRenewedEmail(p: {
  studioName: string
  tradingName: string
  buyerName: string
  expiresOn: string | null
  link: string
}): Email {
  return renderEmail({
    subject: `Renewed resale certificate from ${p.tradingName}`,
    studioName: p.studioName,
    greeting: 'Hello,',
    blocks: [
      {
        kind: 'p',
        text: `${p.buyerName} uploaded a renewed resale certificate for ${p.tradingName}${
          p.expiresOn ? `, valid until ${p.expiresOn} (as they entered it)` : ''
        }.`,
      },
      { kind: 'button', text: 'Check the certificate', href: p.link },
    ],
  })
}
