/**
 * CIEDE2000 colour difference (CIE 142-2001), computed by culori rather than by hand: the formula's
 * hue-angle averaging is easy to get subtly wrong, and culori's implementation is widely used and
 * checked against Sharma, Wu & Dalal (2005) in our tests.
 */
import { differenceCiede2000 } from 'culori';
import { checkTriple, LAB_NAMES, type Lab } from './triple.ts';

// kL = kC = kH = 1: the reference conditions, and what Sharma, Wu & Dalal's test data assume.
const ciede2000 = differenceCiede2000(1, 1, 1);

/** ΔE00 between two L*a*b* colours (D65; the formula itself does not depend on the white). */
export function deltaE2000(lab1: Lab, lab2: Lab): number {
	checkTriple('The first L*a*b* colour', lab1, LAB_NAMES);
	checkTriple('The second L*a*b* colour', lab2, LAB_NAMES);
	// 'lab65' so culori takes the numbers as they are: any other mode would be converted first.
	const [l1, a1, b1] = lab1;
	const [l2, a2, b2] = lab2;
	return ciede2000({ mode: 'lab65', l: l1, a: a1, b: b1 }, { mode: 'lab65', l: l2, a: a2, b: b2 });
}
