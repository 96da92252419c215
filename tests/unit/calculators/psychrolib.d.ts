// psychrolib ships no types; this covers the calls the cross-checks make.
declare module 'psychrolib' {
	interface Psychrolib {
		readonly SI: number;
		readonly IP: number;
		SetUnitSystem(unitSystem: number): void;
		/** Saturation vapour pressure over liquid water (above 0.01 °C) in Pa, T in °C (SI mode). */
		GetSatVapPres(tDryBulbC: number): number;
		/** Standard-atmosphere pressure in Pa at an altitude in m (SI mode). */
		GetStandardAtmPressure(altitudeM: number): number;
	}
	const psychrolib: Psychrolib;
	export default psychrolib;
}
