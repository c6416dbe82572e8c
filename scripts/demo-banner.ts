import { DEMO_PEOPLE } from '../seeds/demo-people.ts';

/** The lines `npm start` and `npm run dev` print once everything is up. */
export function demoBanner(url: string, extra: string[] = []): string {
  const rows = [
    ['site administrator', DEMO_PEOPLE.admin],
    ['PI', DEMO_PEOPLE.pi],
    ['researcher', DEMO_PEOPLE.researcher],
    ['researcher', DEMO_PEOPLE.researcher2],
    ['reader', DEMO_PEOPLE.reader],
  ] as const;
  const width = Math.max(...rows.map(([, p]) => p.email.length));
  return [
    '',
    `Bifolio is running at ${url}`,
    '',
    'Demo sign-ins:',
    ...rows.map(([role, p]) => `  ${role.padEnd(19)} ${p.email.padEnd(width)}  ${p.password.padEnd(26)} (${p.name})`),
    '',
    `Local outbox (invite and reset mails): ${url}/dev/outbox`,
    ...extra,
    'Press Ctrl-C to stop everything.',
    '',
  ].join('\n');
}
