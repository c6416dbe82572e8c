/**
 * Who a comment mentions: "@" followed by a member's name as shown (e.g. "@Kofi Mensah"), or by the
 * name without a leading title ("@Ines Halvorsen" for "Dr. Ines Halvorsen"). Case is ignored; the
 * name must end at a word boundary, so "@Kofi Mensahs" mentions nobody. Longest names win.
 */
const TITLES = /^(dr|prof|professor|mr|mrs|ms|mx)\.?\s+/i;

const escapeRegExp = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

export function findMentions<P extends { id: string; name: string }>(body: string, people: readonly P[]): P[] {
  const found: P[] = [];
  for (const person of people) {
    const forms = [person.name, person.name.replace(TITLES, '')].filter((f) => f.trim().length > 0);
    const pattern = new RegExp(`(^|[^\\w@])@(${forms.map(escapeRegExp).join('|')})(?![\\w])`, 'iu');
    if (pattern.test(body)) found.push(person);
  }
  return found;
}
