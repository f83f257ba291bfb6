import nodemailer, { type Transporter } from 'nodemailer'

let transporter: Transporter | undefined

function transport(): Transporter {
  // Local catcher and plain SMTP hosts alike: TLS is used when the URL says smtps:// or the host offers it.
  transporter ??= nodemailer.createTransport(useServerConfig().smtpUrl, {
    ignoreTLS: useServerConfig().smtpUrl.includes('127.0.0.1') || useServerConfig().smtpUrl.includes('localhost'),
  } as never)
  return transporter
}

export interface OutgoingMail { to: string, subject: string, text: string, html: string }

export async function sendMail(mail: OutgoingMail) {
  await transport().sendMail({ from: useServerConfig().mailFrom, ...mail })
}

export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' }[c]!))
}

function layout(title: string, paragraphs: string[], action: { label: string, url: string }): string {
  const body = paragraphs.map(p => `<p style="margin:0 0 14px">${escapeHtml(p)}</p>`).join('')
  return `<!doctype html><html><body style="font-family:Georgia,serif;background:#f6f1e7;color:#1d2522;padding:24px">
<div style="max-width:520px;margin:auto;background:#fffdf8;border:1px solid #d9cfbd;border-radius:6px;padding:24px">
<h1 style="font-size:20px;margin:0 0 16px;color:#1f3b36">${escapeHtml(title)}</h1>${body}
<p style="margin:20px 0"><a href="${escapeHtml(action.url)}" style="background:#1f3b36;color:#fffdf8;padding:10px 16px;border-radius:4px;text-decoration:none">${escapeHtml(action.label)}</a></p>
<p style="font-size:13px;color:#5a625e">Or open this address: ${escapeHtml(action.url)}</p>
</div></body></html>`
}

export function invitationMail(input: { to: string, teamName: string, inviterName: string, role: string, url: string, expiresDays: number }): OutgoingMail {
  const subject = `${input.inviterName} invited you to ${input.teamName} on Tallymark`
  const lines = [
    `${input.inviterName} invited you to join ${input.teamName} on Tallymark as ${input.role}.`,
    `Tallymark is the team's shared reference of maker's marks, makers and materials, with its sourcing trips and sales.`,
    `The invitation is valid for ${input.expiresDays} days and can be used once.`,
  ]
  return {
    to: input.to,
    subject,
    text: `${lines.join('\n\n')}\n\nAccept the invitation: ${input.url}\n\nIf you did not expect this, ignore this message.\n`,
    html: layout(`Join ${input.teamName}`, [...lines, 'If you did not expect this, ignore this message.'], { label: 'Accept the invitation', url: input.url }),
  }
}

export function passwordResetMail(input: { to: string, name: string, teamNames: string[], url: string }): OutgoingMail {
  const teams = input.teamNames.length ? ` (${input.teamNames.join(', ')})` : ''
  const lines = [
    `Hello ${input.name},`,
    `someone asked to reset the password of your Tallymark account${teams}.`,
    'The link works once and expires in 1 hour. If it was not you, ignore this message: your password stays as it is.',
  ]
  return {
    to: input.to,
    subject: 'Reset your Tallymark password',
    text: `${lines.join('\n\n')}\n\nChoose a new password: ${input.url}\n`,
    html: layout('Reset your password', lines, { label: 'Choose a new password', url: input.url }),
  }
}
