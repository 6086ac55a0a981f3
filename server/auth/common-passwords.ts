// Refusing passwords that attackers try first (OWASP ASVS 5.0 6.2.4: at least the top 3000
// passwords; 6.2.11: words of this context). The list is the common-password dictionary shipped by
// the kept package @zxcvbn-ts/language-common (MIT licence, github.com/zxcvbn-ts/zxcvbn): 49 233
// passwords, lower case, ordered by how often they turn up in published password leaks. It is loaded
// on first use, not at start.
import { AppError } from '../lib/app-error';

let common: Promise<Set<string>> | null = null;
const commonList = () => (common ??= import('@zxcvbn-ts/language-common').then((m) => new Set(m.dictionary['passwords-common'])));

/** The words a password of this product must not be, besides the list: its name and the person's own. */
function contextWords(person: { email: string; name: string }): string[] {
  const local = person.email.split('@')[0] ?? '';
  return ['stripwarden', person.email, local, person.name.replace(/\s+/g, '')].map((w) => w.toLowerCase()).filter((w) => w.length >= 3);
}

const bare = (s: string) => s.normalize('NFKC').toLowerCase().replace(/\s+/g, '');

/** Throws a 422 naming the field when the password is a common one or one of the context words. */
export async function refuseCommonPassword(password: string, person: { email: string; name: string }): Promise<void> {
  const p = bare(password);
  // "Password1!" is "password" with the usual decorations: strip trailing digits and symbols too.
  const stem = p.replace(/[\d\W_]+$/u, '');
  const list = await commonList();
  const context = contextWords(person);
  const hit = list.has(p) || (stem.length >= 4 && list.has(stem)) || context.includes(p) || context.includes(stem);
  if (!hit) return;
  const message =
    'This password is on a list of commonly used passwords (or is your name, e-mail or the product’s name), which attackers try first. ' +
    'Choose another: a few unrelated words make a strong one.';
  throw new AppError(422, 'common-password', message, { errors: [{ path: 'password', message }] });
}
