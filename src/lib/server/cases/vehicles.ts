// A shop's vehicles: one row per VIN per shop, reused by every case on that vehicle.
import { and, eq, sql } from 'drizzle-orm';
import type { VehicleInput } from '../../api/cases-schema';
import { db } from '../db';
import { vehicles } from '../db/schema';
import { generateId } from '../auth/crypto';

/** Plates are compared without spaces or dashes, upper case. */
export const normalisePlate = (plate: string) => plate.replace(/[\s-]/g, '').toUpperCase();

export const vehicleColumns = {
	id: vehicles.id,
	vin: vehicles.vin,
	plate: vehicles.plate,
	year: vehicles.year,
	make: vehicles.make,
	model: vehicles.model,
	engine: vehicles.engine
};

export async function findVehicle(shopId: string, vehicleId: string) {
	const [row] = await db
		.select(vehicleColumns)
		.from(vehicles)
		.where(and(eq(vehicles.id, vehicleId), eq(vehicles.shopId, shopId)));
	return row;
}

/**
 * The statements that give a case its vehicle: with a VIN, the shop's vehicle of that VIN (its
 * missing details filled in from this one) or a new one; without, a new vehicle. `vehicleId` is
 * the SQL the case row takes as its vehicle_id, resolved inside the same batch.
 */
export function vehicleStatements(shopId: string, input: VehicleInput) {
	const id = generateId();
	const values = {
		id,
		shopId,
		vin: input.vin ?? null,
		plate: input.plate ? normalisePlate(input.plate) : null,
		year: input.year ?? null,
		make: input.make ?? null,
		model: input.model ?? null,
		engine: input.engine ?? null
	};
	if (!input.vin) return { statement: db.insert(vehicles).values(values), vehicleId: sql`${id}` };
	const keep = (column: keyof typeof values & keyof typeof vehicles.$inferSelect) =>
		sql.raw(`coalesce("vehicles"."${vehicles[column].name}", excluded."${vehicles[column].name}")`);
	const statement = db
		.insert(vehicles)
		.values(values)
		.onConflictDoUpdate({
			target: [vehicles.shopId, vehicles.vin],
			set: {
				plate: keep('plate'),
				year: keep('year'),
				make: keep('make'),
				model: keep('model'),
				engine: keep('engine')
			}
		});
	const vehicleId = sql`(SELECT ${vehicles.id} FROM ${vehicles} WHERE ${vehicles.shopId} = ${shopId} AND ${vehicles.vin} = ${input.vin})`;
	return { statement, vehicleId };
}
