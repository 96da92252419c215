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

export function signupMessage(args: {
	to: string;
	shopName: string;
	link: string;
	expiresHours: number;
}): MailMessage {
	return {
		to: args.to,
		subject: `Finish setting up ${args.shopName} on Causeway`,
		text:
			`Someone asked to set up the shop ${args.shopName} on Causeway with this address.\n\n` +
			`Open this link to create the shop and sign in (it works once, for ${args.expiresHours} hours):\n${args.link}` +
			footer
	};
}

export function signupExistingAccountMessage(args: { to: string; baseUrl: string }): MailMessage {
	return {
		to: args.to,
		subject: 'You already use Causeway',
		text:
			`Someone asked to set up a new shop on Causeway with this address, which already has an account, so no shop was created.\n\n` +
			`Sign in here: ${args.baseUrl}/signin\nForgot the password? Choose a new one here: ${args.baseUrl}/reset` +
			footer
	};
}
