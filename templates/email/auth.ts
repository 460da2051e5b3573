import { renderEmail } from './layout'
import type { Email } from './layout'

export function passwordResetEmail(p: { name: string; link: string; studioName: string }): Email {
  return renderEmail({
    subject: `Reset your ${p.studioName} wholesale password`,
    studioName: p.studioName,
    greeting: `Hello ${p.name},`,
    blocks: [
      {
        kind: 'p',
        text: 'Someone asked to reset the password of your account. If it was you, choose a new one here:',
      },
      { kind: 'button', text: 'Choose a new password', href: p.link },
      {
        kind: 'small',
        text: 'The link works once and expires in one hour. If you did not ask for it, ignore this e-mail: your password stays as it is.',
      },
    ],
  })
}

export function invitationEmail(p: {
  name: string
  link: string
  studioName: string
  roleLabel: string
  shopName?: string | null
}): Email {
  return renderEmail({
    subject: `You are invited to ${p.studioName} on Lathercase`,
    studioName: p.studioName,
    greeting: `Hello ${p.name},`,
    blocks: [
      {
        kind: 'p',
        text: p.shopName
          ? `${p.studioName} has opened a wholesale account for ${p.shopName} and invited you to order for it.`
          : `${p.studioName} has invited you to join as ${p.roleLabel.toLowerCase()}.`,
      },
      { kind: 'button', text: 'Set your password', href: p.link },
      { kind: 'small', text: 'The link works once and expires in seven days.' },
    ],
  })
}
