/**
 * Password rules, shared by the forms (as hints) and the server (as the check). OWASP ASVS 5.0:
 * 6.2.1 at least 8 characters (15 recommended; Meniscus asks for 12), 6.2.9 at least 64 allowed
 * (we allow 256), 6.2.8 no truncation or other change (Argon2id takes the whole string), 6.2.5 no
 * composition rules, 6.2.4 refuse the most common passwords, 6.2.11 refuse passwords built from
 * the account's own details.
 */
export const PASSWORD_MIN = 12;
export const PASSWORD_MAX = 256;

// The most common passwords of public breach corpora, lowercase (from memory of the published top
// lists; a full breached-password check needs an online service, which this workplace has not).
const COMMON = new Set([
	'123456789012', '1234567890123', 'qwertyuiopas', 'password1234', 'password12345', 'passwordpassword',
	'iloveyou1234', '111111111111', '000000000000', 'abcdefghijkl', 'qwerty123456', '1q2w3e4r5t6y',
	'123qweasdzxc', 'letmeinletmein', 'welcome12345', 'administrator', 'changeme1234', 'trustno1trustno1',
	'football1234', 'baseball1234', 'sunshine1234', 'princess1234', 'monkey123456', 'dragon123456',
	'mustang12345', 'superman1234', 'starwars1234', 'qwertyqwerty', 'asdfghjklasdf', 'zxcvbnmzxcvbnm',
]);

export type PasswordProblem = 'too-short' | 'too-long' | 'common' | 'personal' | 'repetitive';

export const PASSWORD_PROBLEM_TEXT: Record<PasswordProblem, string> = {
	'too-short': `Use at least ${PASSWORD_MIN} characters; a few unrelated words make a good one.`,
	'too-long': `Use at most ${PASSWORD_MAX} characters.`,
	common: 'That password is among the most common ones; choose another.',
	personal: 'Do not build the password from your e-mail address or name.',
	repetitive: 'That password repeats one character or a short run; choose another.',
};

/** Problems with a proposed password, empty when it is acceptable. Length counts code points. */
export function passwordProblems(
	password: string,
	context: { email?: string; name?: string } = {},
): PasswordProblem[] {
	const problems: PasswordProblem[] = [];
	const length = [...password].length;
	if (length < PASSWORD_MIN) problems.push('too-short');
	if (length > PASSWORD_MAX) problems.push('too-long');
	const lower = password.toLowerCase();
	if (COMMON.has(lower)) problems.push('common');
	if (/^(.{1,3})\1+$/su.test(password)) problems.push('repetitive');
	const personal = [context.email?.split('@')[0], context.name]
		.filter((s): s is string => !!s && s.length >= 4)
		.map((s) => s.toLowerCase().replace(/\s+/g, ''));
	if (personal.some((p) => lower.replace(/\s+/g, '').includes(p))) problems.push('personal');
	return problems;
}
