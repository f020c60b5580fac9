import { z } from 'zod';

/** C0 controls (NUL, bell, line breaks, tab…) and DEL: never part of a name. */
// eslint-disable-next-line no-control-regex -- matching control characters is the point
const CONTROL = /[\u0000-\u001f\u007f]/;
/**
 * Bidirectional embedding, override and isolate controls (Unicode UAX #9: U+202A–U+202E,
 * U+2066–U+2069): they make a name display differently from what it is ("scan\u202Evsc.exe").
 */
const BIDI = /[\u202a-\u202e\u2066-\u2069]/;

const codePoint = (ch: string) => `U+${ch.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`;

/** Why a name or header cannot be used as it is, in the user's words; null when it is fine. */
export function unsafeNameProblem(text: string): string | null {
  const c = CONTROL.exec(text);
  if (c)
    return `must not contain control characters such as NUL (found ${codePoint(c[0])} at character ${c.index + 1})`;
  const b = BIDI.exec(text);
  if (b)
    return `must not contain bidirectional override characters, which make text display differently from what it is (found ${codePoint(b[0])} at character ${b.index + 1})`;
  return null;
}

/** A zod check for names: refuses control and bidi override characters with unsafeNameProblem's words. */
export function safeName<T extends z.ZodType<string>>(schema: T) {
  return schema.superRefine((value, ctx) => {
    const problem = unsafeNameProblem(value);
    if (problem) ctx.addIssue({ code: 'custom', message: problem });
  });
}
