// The hosted public intake form: a shop's customers describe the problem in everyday words and
// it arrives in the bay's queue as a waiting case. Rate-limited per address, with a honeypot.
import { eq } from 'drizzle-orm';
import { z } from 'zod';
import { MAX_COMPLAINT_CHARS } from '../../api/schema';
import { MAX_ODOMETER, plateSchema } from '../../api/cases-schema';
import { ODOMETER_UNITS } from '../../cases/model';
import { normaliseVin, validateVin } from '../../vehicle/vin';
import { db } from '../db';
import { shops } from '../db/schema';
import { getPublishedEdition } from '../editions';
import { hitRateLimits } from '../auth/form-rate-limit';
import { openCase } from './cases';
import { indexRulebook } from './scoring';

/** Per address and shop; a front desk sending its own customers' forms stays well under it. */
export const INTAKE_LIMIT_PER_HOUR = 10;
/** Per shop from every address together: a flood from many addresses stops here. */
export const INTAKE_SHOP_LIMIT_PER_HOUR = 300;
/** The hidden field a person never fills in (it is off-screen and out of the tab order). */
export const HONEYPOT_FIELD = 'website';

type Choice = { value: string; label: string; answer: boolean | string };

/** The questions in the customer's words, each mapped to an observation of the rulebook. */
export const INTAKE_QUESTIONS: {
	name: string;
	observation: string;
	label: string;
	choices: Choice[];
}[] = [
	{
		name: 'gauge',
		observation: 'temp_gauge',
		label: 'When does the temperature gauge read higher than usual?',
		choices: [
			{ value: 'normal', label: 'It stays where it always is', answer: 'normal' },
			{ value: 'idle', label: 'Standing still or in slow traffic', answer: 'high_at_idle' },
			{ value: 'speed', label: 'At motorway speed', answer: 'high_at_speed' },
			{ value: 'load', label: 'Towing, climbing or carrying a load', answer: 'high_under_load' },
			{ value: 'always', label: 'All the time once warm', answer: 'high_always' },
			{ value: 'swings', label: 'It goes up and down', answer: 'fluctuates' }
		]
	},
	{
		name: 'topping',
		observation: 'level_drops_between_checks',
		label: 'Do you keep having to top up the coolant?',
		choices: yesNo()
	},
	{
		name: 'puddle',
		observation: 'puddle_under_vehicle',
		label: 'Is there a drip or puddle under the car after it has been parked?',
		choices: yesNo()
	},
	{
		name: 'smell',
		observation: 'sweet_smell',
		label: 'Do you notice a sweet, syrupy smell?',
		choices: [
			{ value: 'none', label: 'No', answer: 'none' },
			{ value: 'outside', label: 'Yes, around the bonnet', answer: 'engine_bay' },
			{ value: 'inside', label: 'Yes, inside the car', answer: 'cabin' }
		]
	},
	{
		name: 'smoke',
		observation: 'exhaust_smoke',
		label: 'Is there white smoke from the exhaust?',
		choices: [
			{ value: 'none', label: 'No', answer: 'none' },
			{
				value: 'cold',
				label: 'Only for a moment on a cold morning',
				answer: 'white_at_cold_start_only'
			},
			{ value: 'lasting', label: 'Yes, and it keeps going once warm', answer: 'white_persistent' }
		]
	},
	{
		name: 'heater',
		observation: 'heater_output',
		label: 'Does the heater blow warm air once the engine is warm?',
		choices: [
			{ value: 'normal', label: 'Yes, as usual', answer: 'normal' },
			{ value: 'cold', label: 'No, it stays cold', answer: 'cold' },
			{ value: 'idle', label: 'Only while driving, not when standing', answer: 'cold_at_idle' },
			{ value: 'onoff', label: 'It comes and goes', answer: 'intermittent' }
		]
	},
	{
		name: 'service',
		observation: 'recent_coolant_service',
		label: 'Has the cooling system been drained, refilled or repaired in the last two weeks?',
		choices: yesNo()
	}
];

function yesNo(): Choice[] {
	return [
		{ value: 'yes', label: 'Yes', answer: true },
		{ value: 'no', label: 'No', answer: false }
	];
}

const text = (max: number, message: string) =>
	z.string({ error: message }).trim().max(max, `Keep it under ${max} characters.`);
const optionalText = (max: number) =>
	z
		.string()
		.trim()
		.max(max, `Keep it under ${max} characters.`)
		.optional()
		.transform((v) => v || undefined);
const optionalNumber = (min: number, max: number, message: string) =>
	z
		.string()
		.trim()
		.optional()
		.transform((v) => (v ? Number(v) : undefined))
		.refine((v) => v === undefined || (Number.isFinite(v) && v >= min && v <= max), message);

export const intakeFormSchema = z
	.object({
		complaint: text(MAX_COMPLAINT_CHARS, 'Tell us what the car is doing.').min(
			3,
			'Tell us what the car is doing.'
		),
		name: text(120, 'Enter your name.').min(1, 'Enter your name.'),
		phone: optionalText(30).refine(
			(v) => v === undefined || /^[+0-9 ()./-]{5,30}$/.test(v),
			'Enter a phone number (digits, spaces, + or -).'
		),
		email: optionalText(254).refine(
			(v) => v === undefined || z.email().safeParse(v).success,
			'Enter a valid e-mail address.'
		),
		make: text(100, 'Enter the make.').min(1, 'Enter the make.'),
		model: text(100, 'Enter the model.').min(1, 'Enter the model.'),
		year: optionalNumber(1900, 2100, 'Enter a year such as 2014.'),
		plate: optionalText(15).refine(
			(v) => v === undefined || plateSchema.safeParse(v).success,
			'Letters, digits and spaces only.'
		),
		vin: optionalText(20)
			.transform((v) => (v ? normaliseVin(v) : undefined))
			.superRefine((v, ctx) => {
				const check = v ? validateVin(v) : { ok: true as const };
				if (!check.ok)
					ctx.addIssue({ code: 'custom', message: `This VIN looks wrong: ${check.reason}.` });
			}),
		odometer: optionalNumber(0, MAX_ODOMETER, 'Enter the mileage shown on the dashboard.'),
		odometerUnit: z.enum(ODOMETER_UNITS).default('km'),
		[HONEYPOT_FIELD]: z.string().optional(),
		...Object.fromEntries(
			INTAKE_QUESTIONS.map((q) => [
				q.name,
				z.enum(['', ...q.choices.map((c) => c.value)]).optional()
			])
		)
	})
	.refine((form) => form.phone || form.email, {
		message: 'Give a phone number or an e-mail address so the shop can reach you.',
		path: ['phone']
	});

export type IntakeForm = z.infer<typeof intakeFormSchema>;

export async function findIntakeShop(slug: string) {
	const [shop] = await db
		.select({ id: shops.id, name: shops.name })
		.from(shops)
		.where(eq(shops.slug, slug));
	return shop;
}

/** Counts a post from an address (every post counts, valid or not). */
export function countIntakePost(shopId: string, ip: string, now?: number) {
	return hitRateLimits(
		[
			{ key: `intake:${shopId}:ip:${ip}`, limit: INTAKE_LIMIT_PER_HOUR },
			{ key: `intake:${shopId}`, limit: INTAKE_SHOP_LIMIT_PER_HOUR }
		],
		3600,
		now
	);
}

/** The answers the customer gave, for the observations this edition knows ("not sure" is left out). */
function intakeAnswers(form: Record<string, unknown>, known: (key: string) => boolean) {
	const observations: Record<string, boolean | string> = {};
	for (const question of INTAKE_QUESTIONS) {
		const choice = question.choices.find((c) => c.value === form[question.name]);
		if (choice && known(question.observation)) observations[question.observation] = choice.answer;
	}
	return observations;
}

/** Writes the form as a waiting case of the shop; returns its id. */
export async function submitIntake(shopId: string, form: IntakeForm, now = new Date()) {
	const edition = await getPublishedEdition(shopId);
	const { observations } = indexRulebook(edition.rulebook);
	return openCase(
		{ shopId, userId: null, apiKeyId: null },
		edition,
		{
			status: 'waiting',
			source: 'intake-form',
			vehicle: {
				make: form.make,
				model: form.model,
				year: form.year,
				plate: form.plate,
				vin: form.vin
			},
			odometer:
				form.odometer === undefined ? undefined : { value: form.odometer, unit: form.odometerUnit },
			complaint: form.complaint,
			contact: { name: form.name, phone: form.phone, email: form.email },
			observations: intakeAnswers(form, (key) => observations.has(key)),
			unknown: []
		},
		now
	);
}
