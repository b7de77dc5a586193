// The product's e-mails. Each takes the facts it needs and sends one message through the mailer.
import type { Mailer } from './mailer';

const signature = '\n\n— Anglebench, the bench log of your sine/cosine cores';

export function sendInvitationMail(mailer: Mailer, to: string, args: { link: string; role: string; invitedBy: string; expiresAt: Date }) {
  return mailer.send({
    to,
    subject: 'You are invited to Anglebench',
    text:
      `${args.invitedBy} invited you to the team's Anglebench as ${args.role}.\n\n` +
      `Choose your name and password here (the link works once, until ${args.expiresAt.toISOString()}):\n${args.link}` +
      signature,
  });
}

export function sendReviewRequestedMail(mailer: Mailer, to: string[], args: { build: string; core: string; requestedBy: string; link: string }) {
  return mailer.send({
    to,
    subject: `Review requested: ${args.core} build ${args.build}`,
    text: `${args.requestedBy} asks for a review of build ${args.build} of ${args.core}.\n\n${args.link}` + signature,
  });
}

export function sendReviewDecisionMail(
  mailer: Mailer,
  to: string,
  args: { build: string; core: string; reviewer: string; decision: 'approve' | 'reject'; note: string; link: string },
) {
  const verb = args.decision === 'approve' ? 'approved' : 'rejected';
  return mailer.send({
    to,
    subject: `Build ${args.build} of ${args.core} ${verb}`,
    text: `${args.reviewer} ${verb} build ${args.build} of ${args.core}.${args.note ? `\n\nNote: ${args.note}` : ''}\n\n${args.link}` + signature,
  });
}

/** Sent when a session fails a limit that its core's baseline session met. */
export function sendRegressionMail(
  mailer: Mailer,
  to: string[],
  args: { core: string; build: string; sessionId: number; failedLimits: string[]; link: string },
) {
  return mailer.send({
    to,
    subject: `Regression on ${args.core}: build ${args.build}`,
    text:
      `Session ${args.sessionId} of ${args.core} (build ${args.build}) fails limits its baseline met:\n` +
      args.failedLimits.map((l) => `  - ${l}`).join('\n') +
      `\n\n${args.link}` +
      signature,
  });
}
