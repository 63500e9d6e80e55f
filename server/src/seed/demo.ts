import { and, eq } from 'drizzle-orm';
import { DEMO_USERS } from '../../../oidc-fake/src/users';
import type { Db, Tx } from '../db/client';
import { memberships, projects, studies, users } from '../db/schema';
import { createStudy } from '../studies/service';

/**
 * The invented demo scenario: Tamsk Aerodynamics (a fictional company) designing the natural-laminar-flow
 * wing and nacelles of its fictional Larkspur T-62 business jet. Idempotent: a second run adds nothing.
 */
export const DEMO_PROJECT = 'Larkspur T-62 wing';
export const DEMO_NACELLE_PROJECT = 'Larkspur T-62 nacelles';
export const DEMO_STUDY = 'Outboard section, cruise: laminar run and drag (invented data)';
export const DEMO_NACELLE_STUDY = 'Nacelle pod, cruise: laminar forebody (invented data)';

export interface DemoSeedResult {
  projectId: string;
  studyId: string;
  created: boolean;
}

/** Hooks that later parts of the product use to put content in the demo study (cells, versions). */
export type DemoStudyFiller = (tx: Tx, ids: { projectId: string; studyId: string; authorId: string }) => Promise<void>;

/**
 * Seeds the scenario; `fillers` fill the wing study and `nacelleFillers` the nacelle study when each is
 * first created.
 */
export async function seedDemo(db: Db, fillers: DemoStudyFiller[] = [], nacelleFillers: DemoStudyFiller[] = []): Promise<DemoSeedResult> {
  return db.transaction(async (tx) => {
    const ids = new Map<string, string>();
    for (const person of DEMO_USERS) {
      const [row] = await tx
        .insert(users)
        .values({ email: person.email, name: person.name, siteAdmin: person.siteAdmin })
        .onConflictDoUpdate({ target: users.email, set: { siteAdmin: person.siteAdmin } })
        .returning({ id: users.id });
      ids.set(person.email, row!.id);
    }
    const admin = DEMO_USERS.find((p) => p.siteAdmin)!;
    const lead = DEMO_USERS.find((p) => p.role === 'lead')!;
    const engineer = DEMO_USERS.find((p) => p.role === 'engineer')!;

    const ensureProject = async (name: string, description: string) => {
      const [found] = await tx.select().from(projects).where(eq(projects.name, name));
      if (found) return { id: found.id, created: false };
      const [row] = await tx.insert(projects).values({ name, description, createdBy: ids.get(admin.email)! }).returning();
      return { id: row!.id, created: true };
    };
    const addMember = async (projectId: string, email: string, role: 'lead' | 'engineer' | 'reviewer' | 'viewer') => {
      await tx.insert(memberships).values({ projectId, userId: ids.get(email)!, role }).onConflictDoNothing();
    };

    const wing = await ensureProject(
      DEMO_PROJECT,
      'Invented demo scenario: natural-laminar-flow wing of the fictional Tamsk Aerodynamics Larkspur T-62 business jet.',
    );
    for (const person of DEMO_USERS) if (person.role) await addMember(wing.id, person.email, person.role);

    const nacelle = await ensureProject(DEMO_NACELLE_PROJECT, 'Invented demo scenario: laminar nacelle lips of the Larkspur T-62 (lead and engineer only).');
    await addMember(nacelle.id, lead.email, 'lead');
    await addMember(nacelle.id, engineer.email, 'engineer');

    const [existing] = await tx.select().from(studies).where(and(eq(studies.projectId, wing.id), eq(studies.title, DEMO_STUDY)));
    const actor = { id: ids.get(engineer.email)!, email: engineer.email, name: engineer.name, siteAdmin: false };
    const study =
      existing ??
      (await createStudy(tx, actor, wing.id, {
        title: DEMO_STUDY,
        description:
          'Invented data for the demo: where does the boundary layer of the Larkspur T-62 outboard section turn turbulent at cruise, and what is it worth in drag?',
      }));
    if (!existing) for (const fill of fillers) await fill(tx, { projectId: wing.id, studyId: study.id, authorId: actor.id });

    const [existingPod] = await tx.select().from(studies).where(and(eq(studies.projectId, nacelle.id), eq(studies.title, DEMO_NACELLE_STUDY)));
    if (!existingPod) {
      const pod = await createStudy(tx, actor, nacelle.id, {
        title: DEMO_NACELLE_STUDY,
        description: 'Invented data for the demo: how far does the boundary layer on the Larkspur T-62 nacelle pod stay laminar at cruise, and how firmly?',
      });
      for (const fill of nacelleFillers) await fill(tx, { projectId: nacelle.id, studyId: pod.id, authorId: actor.id });
    }
    return { projectId: wing.id, studyId: study.id, created: !existing };
  });
}
