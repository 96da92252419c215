// The mails the product sends: an invitation and a password reset.
import type { MailMessage } from './mailer';

const footer =
	'\n\nIf you did not expect this message, you can ignore it; nothing changes until the link is used.\n— Causeway';

export function inviteMessage(args: {
	to: string;
	shopName: string;
	invitedBy: string;
	roleLabel: string;
	link: string;
	expiresHours: number;
}): MailMessage {
	return {
		to: args.to,
		subject: `You are invited to ${args.shopName} on Causeway`,
		text:
			`${args.invitedBy} invited you to join ${args.shopName} on Causeway as ${args.roleLabel}.\n\n` +
			`Set your password and sign in here (the link works once, for ${args.expiresHours} hours):\n${args.link}` +
			footer
	};
}

export function passwordResetMessage(args: {
	to: string;
	link: string;
	expiresMinutes: number;
}): MailMessage {
	return {
		to: args.to,
		subject: 'Reset your Causeway password',
		text:
			`Someone asked to reset the password of this Causeway account.\n\n` +
			`Choose a new password here (the link works once, for ${args.expiresMinutes} minutes):\n${args.link}` +
			footer
	};
}
