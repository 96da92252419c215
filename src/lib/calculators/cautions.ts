/** Cautions shown beside the work a calculator leads to. The technician decides; these inform. */
export const CAUTION_HOT_CAP =
	'Never open a hot, pressurised cap: the coolant can boil at once and spray out. Let the engine cool, then turn the cap to its first stop with a rag over it.';

export const CAUTION_COOLANT_POISON =
	'Coolant is poisonous to people and animals: keep it away from children and pets, wipe up spills, and take used coolant to an approved collection point.';

export const CAUTION_FOLLOW_PROCEDURE =
	"Follow the vehicle maker's procedure and coolant specification, local regulations and licensed practice.";
