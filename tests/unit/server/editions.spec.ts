// The compiled-edition cache against a real SQLite file: shared by content, compiled once, LRU.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { makeCoolingRulebook } from '../diagnosis/factories';

const compiled = vi.hoisted(() => ({ count: 0 }));
vi.mock('../../../src/lib/diagnosis', async (importOriginal) => {
	const original = await importOriginal<typeof import('../../../src/lib/diagnosis')>();
	return {
		...original,
		createDiagnoser: (...args: Parameters<typeof original.createDiagnoser>) => {
			compiled.count++;
			return original.createDiagnoser(...args);
		}
	};
});

const folder = mkdtempSync(join(tmpdir(), 'causeway-editions-'));
process.env.DATABASE_URL = `file:${join(folder, 'editions.db')}`;
const { db, prepare } = await import('../../../src/lib/server/db');
const { rulebookEditions, shops } = await import('../../../src/lib/server/db/schema');
const editions = await import('../../../src/lib/server/editions');

const SHOPS = 250;
const shopIds = Array.from({ length: SHOPS }, (_, index) => `shop-${index}`);

beforeAll(async () => {
	await prepare();
	await db.insert(shops).values(shopIds.map((id) => ({ id, name: `Test shop ${id}` })));
	for (const id of shopIds) await editions.seedBaseEdition(id, null);
}, 60_000);

afterAll(() => {
	db.$client.close();
	rmSync(folder, { recursive: true, force: true });
});

describe('compiled editions', () => {
	it('compiles the base edition once when 50 shops ask for it at the same time', async () => {
		compiled.count = 0;
		const results = await Promise.all(
			shopIds.slice(0, 50).map((shopId) => editions.getPublishedEdition(shopId))
		);
		expect(compiled.count).toBe(1);
		expect(new Set(results.map((edition) => edition.diagnoser)).size).toBe(1);
		expect(new Set(results.map((edition) => edition.id)).size).toBe(50);
	});

	it('compiles each distinct edition once with 250 shops in rotation', async () => {
		compiled.count = 0;
		// Ten shops publish an edition 2 of their own, each different from the base and the others.
		for (const [index, shopId] of shopIds.slice(0, 10).entries()) {
			const content = makeCoolingRulebook();
			content.meta.name = `Edition of ${shopId} (${index})`;
			await db.insert(rulebookEditions).values({
				id: `edition-2-${shopId}`,
				shopId,
				number: 2,
				status: 'published',
				content,
				publishedAt: new Date(0)
			});
		}
		for (let round = 0; round < 3; round++) {
			for (const shopId of shopIds) await editions.getPublishedEdition(shopId);
		}
		// The base edition was compiled by the test before; each new edition 2 once.
		expect(compiled.count).toBe(10);
		const second = await editions.getPublishedEdition(shopIds[3]);
		expect(second.number).toBe(2);
		expect(second.rulebook.meta.name).toBe('Edition of shop-3 (3)');
	}, 60_000);

	it('keeps the editions used most recently when more are published than it holds', async () => {
		compiled.count = 0;
		const count = editions.MAX_COMPILED_EDITIONS + 5;
		const ids = Array.from({ length: count }, (_, index) => `lru-shop-${index}`);
		await db.insert(shops).values(ids.map((id) => ({ id, name: id })));
		for (const [index, shopId] of ids.entries()) {
			const content = makeCoolingRulebook();
			content.meta.name = `LRU edition ${index}`;
			await db.insert(rulebookEditions).values({
				id: `edition-${shopId}`,
				shopId,
				number: 1,
				status: 'published',
				content,
				publishedAt: new Date(0)
			});
		}
		for (const shopId of ids) {
			await editions.getPublishedEdition(shopId);
			// The base edition is in use all along, so it is never the least recently used.
			await editions.getPublishedEdition(shopIds[100]);
		}
		expect(compiled.count).toBe(count);
		await editions.getPublishedEdition(shopIds[200]);
		expect(compiled.count).toBe(count);
		// The first of them fell out (the cache holds MAX_COMPILED_EDITIONS): compiled again.
		await editions.getPublishedEdition(ids[0]);
		expect(compiled.count).toBe(count + 1);
	}, 60_000);
});
