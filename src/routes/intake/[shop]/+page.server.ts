// A shop's hosted intake form: a customer describes the problem, it becomes a waiting case.
import { error, fail, redirect } from '@sveltejs/kit';
import {
	countIntakePost,
	findIntakeShop,
	HONEYPOT_FIELD,
	INTAKE_QUESTIONS,
	intakeFormSchema,
	submitIntake
} from '$lib/server/cases/intake';
import { failForm, parseForm } from '$lib/server/forms';
import { clientIp } from '$lib/server/http';
import type { Action, Actions, PageServerLoad } from './$types';

async function shopOf(slug: string) {
	const shop = await findIntakeShop(slug);
	if (!shop) error(404, { message: 'There is no intake form at this address.' });
	return shop;
}

export const load: PageServerLoad = async ({ params }) => {
	const shop = await shopOf(params.shop);
	return {
		shopName: shop.name,
		questions: INTAKE_QUESTIONS.map(({ name, label, choices }) => ({
			name,
			label,
			choices: choices.map(({ value, label }) => ({ value, label }))
		}))
	};
};

/** Fields sent back to the form after a mistake (everything the customer typed). */
const echo = (formData: FormData) =>
	Object.fromEntries(
		[...formData].filter(([k, v]) => k !== HONEYPOT_FIELD && typeof v === 'string')
	);

const submitAction: Action = async (event) => {
	const shop = await shopOf(event.params.shop);
	const formData = await event.request.formData();
	const limit = await countIntakePost(shop.id, clientIp(event));
	if (!limit.allowed) {
		return fail(429, {
			message: 'Too many forms from this address. Please try again later or call the shop.',
			values: echo(formData)
		});
	}
	const parsed = parseForm(intakeFormSchema, formData);
	if (!parsed.ok) return failForm(parsed.errors, echo(formData));
	// A filled-in honeypot is a robot: thank it like anyone else and write nothing.
	if (!parsed.data[HONEYPOT_FIELD]) await submitIntake(shop.id, parsed.data);
	redirect(303, `/intake/${event.params.shop}/thanks`);
};

export const actions = { default: submitAction } satisfies Actions;
