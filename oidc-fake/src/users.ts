/**
 * The people of the invented demo scenario: Tamsk Aerodynamics, a fictional company designing the
 * fictional "Larkspur T-62" business jet. Nobody here is real; the e-mail domain is reserved
 * (`.example`, RFC 2606) so no message can reach anyone.
 *
 * The server's seed imports this list to give each person their project role, so the shape is shared.
 */
export type DemoRole = 'lead' | 'engineer' | 'reviewer' | 'viewer';

export interface DemoUser {
  /** OpenID Connect subject identifier, stable across restarts. */
  sub: string;
  email: string;
  name: string;
  /** Role in the demo project; `null` for someone who is in no project. */
  role: DemoRole | null;
  siteAdmin: boolean;
  title: string;
}

const people: DemoUser[] = [
  {
    sub: 'tamsk-ines',
    email: 'ines.caldera@tamsk.example',
    name: 'Ines Caldera',
    role: null,
    siteAdmin: true,
    title: 'Site administrator',
  },
  {
    sub: 'tamsk-mara',
    email: 'mara.okonkwo@tamsk.example',
    name: 'Mara Okonkwo',
    role: 'lead',
    siteAdmin: false,
    title: 'Aerodynamics team lead',
  },
  {
    sub: 'tamsk-dev',
    email: 'dev.arjunan@tamsk.example',
    name: 'Dev Arjunan',
    role: 'engineer',
    siteAdmin: false,
    title: 'Laminar-flow engineer',
  },
  {
    sub: 'tamsk-lotte',
    email: 'lotte.brandvik@tamsk.example',
    name: 'Lotte Brandvik',
    role: 'reviewer',
    siteAdmin: false,
    title: 'Design reviewer',
  },
  {
    sub: 'tamsk-pim',
    email: 'pim.vasquez@tamsk.example',
    name: 'Pim Vasquez',
    role: 'viewer',
    siteAdmin: false,
    title: 'Programme analyst',
  },
  {
    // In no project at all: the account the "a project you are not in answers 404" checks sign in as.
    sub: 'tamsk-outsider',
    email: 'rafe.ostrander@tamsk.example',
    name: 'Rafe Ostrander',
    role: null,
    siteAdmin: false,
    title: 'Structures (no project)',
  },
];

export const DEMO_USERS: readonly Readonly<DemoUser>[] = Object.freeze(people.map((user) => Object.freeze(user)));

export function findDemoUser(sub: string): DemoUser | undefined {
  return DEMO_USERS.find((user) => user.sub === sub);
}
