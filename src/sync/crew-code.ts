/**
 * Crew codes — answers "what does a phone type (or scan) to join a crew's study?"
 *
 * A crew code is 16 symbols of Crockford's Base32 (Crockford, "Base 32", crockford.com/base32.html):
 * digits and capital letters without I, L, O and U, so a code read aloud or off a sunlit screen has no
 * look-alike pairs. 16 symbols carry 80 bits: with attempts rate-limited by the server (src/server), a
 * guesser making 10 tries a minute for a year tries about 5·10⁶ codes of 1.2·10²⁴ — a chance below 10⁻¹⁷
 * (OWASP ASVS 4.0.3, V2.7 / V3.2: unguessable, high-entropy secrets). It is shown in four groups of four
 * (`7K2M-Q9XD-4HVA-P3WE`) and typed in any case, with or without spaces or hyphens; the letters O, I and L
 * typed by mistake are read as 0, 1 and 1, as Crockford's decoding rule says. Anything else is refused,
 * never guessed.
 *
 * @example normalizeCrewCode('7k2m q9xd 4hva p3we') // '7K2MQ9XD4HVAP3WE'
 */

export const CREW_CODE_ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';
export const CREW_CODE_LENGTH = 16;

/** A new code from 16 random bytes (each byte's low 5 bits pick a symbol: uniform over the 32). */
export function newCrewCode(random: (bytes: Uint8Array) => Uint8Array): string {
  const bytes = random(new Uint8Array(CREW_CODE_LENGTH));
  let code = '';
  for (const b of bytes) code += CREW_CODE_ALPHABET[b & 31];
  return code;
}

/** The code in four groups of four, for reading off a screen. */
export function formatCrewCode(code: string): string {
  return code.match(/.{1,4}/g)?.join('-') ?? code;
}

/** The code as typed → its canonical 16 symbols, or null when it is not a crew code. */
export function normalizeCrewCode(typed: string): string | null {
  const text = typed.toUpperCase().replace(/[\s-]/g, '').replace(/O/g, '0').replace(/[IL]/g, '1');
  if (text.length !== CREW_CODE_LENGTH) return null;
  for (const ch of text) if (!CREW_CODE_ALPHABET.includes(ch)) return null;
  return text;
}
