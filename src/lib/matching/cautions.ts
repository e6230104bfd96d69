/**
 * Short safety notes the solvers attach to their results. Plain words, shown where the risk
 * arises; they defer to the maker's instructions, the venue's rules and qualified people.
 */

/** Shown with every gel fix. */
export const GEL_HEAT_CAUTION =
	'Heat: gels near hot tungsten or HMI units fade and can melt or burn. Keep an air gap from the lens, use heat-resistant material, and remove any gel that smokes. Follow the maker’s and the venue’s rules.';

/** Shown with fixes on house lights and practicals (sleeves or sheets on fittings). */
export const HOUSE_LIGHT_CAUTION =
	'Fittings get warm too: keep filter sleeves and sheets off lamps and vents, leave ventilation clear, and ask the venue before filtering its lights. Electrical work is for a qualified person.';

/** Shown with LED fixes. */
export const LED_CAUTION =
	'LEDs shift colour with level and across a bi-colour range: measure again at the level you use.';
