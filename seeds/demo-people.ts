import type { NotebookRole, SiteRole } from '@shared/domain/roles.ts';

/**
 * The demo group: the Ostrander Group for Nonlinear Process Dynamics at the (invented)
 * Vell Harbour Institute. Addresses use the reserved .example domain.
 */
export interface DemoPerson {
  name: string;
  email: string;
  password: string;
  siteRole: SiteRole;
}

export const DEMO_PEOPLE = {
  admin: { name: 'Sam Whitlow', email: 'sam.whitlow@vellharbour.example', password: 'whitlow-admin-2026', siteRole: 'administrator' },
  pi: { name: 'Dr. Ines Halvorsen', email: 'ines.halvorsen@vellharbour.example', password: 'halvorsen-pi-2026', siteRole: 'member' },
  researcher: { name: 'Kofi Mensah', email: 'kofi.mensah@vellharbour.example', password: 'mensah-research-2026', siteRole: 'member' },
  researcher2: { name: 'Mira Castellanos', email: 'mira.castellanos@vellharbour.example', password: 'castellanos-research-2026', siteRole: 'member' },
  reader: { name: 'Jun Okafor', email: 'jun.okafor@vellharbour.example', password: 'okafor-reader-2026', siteRole: 'member' },
} as const satisfies Record<string, DemoPerson>;

export type DemoPersonKey = keyof typeof DEMO_PEOPLE;

export interface DemoNotebook {
  key: string;
  title: string;
  description: string;
  /** The first listed PI creates the notebook. */
  members: { person: DemoPersonKey; role: NotebookRole }[];
}

export const DEMO_NOTEBOOKS = {
  stirredTank: {
    key: 'stirredTank',
    title: 'Stirred-tank ignition and extinction',
    description:
      'A continuously stirred tank with one exothermic first-order reaction: where the steady states fold over as the residence time changes, and the hysteresis between ignition and extinction.',
    members: [
      { person: 'pi', role: 'pi' },
      { person: 'researcher', role: 'researcher' },
      { person: 'reader', role: 'reader' },
    ],
  },
  shallowLake: {
    key: 'shallowLake',
    title: 'Shallow lake: clear and turbid states',
    description:
      'Phosphorus loading and the two stable states of a shallow lake: the loads at which the clear state is lost and the turbid state recovers.',
    members: [
      { person: 'pi', role: 'pi' },
      { person: 'researcher2', role: 'researcher' },
      { person: 'reader', role: 'reader' },
    ],
  },
  geneSwitch: {
    key: 'geneSwitch',
    title: 'Two-gene repression switch',
    description:
      'Two genes that repress each other: the region of synthesis rates with two stable expression states, bounded by folds that meet in a cusp.',
    members: [
      { person: 'pi', role: 'pi' },
      { person: 'researcher', role: 'researcher' },
      { person: 'researcher2', role: 'researcher' },
    ],
  },
} as const satisfies Record<string, DemoNotebook>;

export type DemoNotebookKey = keyof typeof DEMO_NOTEBOOKS;
