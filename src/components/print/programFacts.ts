/**
 * The facts a printed program carries, gathered when Print is chosen: whose it is (the signed-in
 * person's own, else left out: a teacher reading a student's copy prints from the submission,
 * which names the student), the lab and class it belongs to, the version and when it was saved.
 * What cannot be read is left out rather than failing the print.
 */
import type { Program } from '@shared/ladder/schema';
import type { UserView } from '@shared/api/auth';
import { api } from '@/api/instance';
import { labsApi } from '@/api/labs';
import type { PrintFacts } from './printModel';

export async function programPrintFacts(a: { programId: string; doc: Program; version: { number: number; createdAt: string } | null; user: UserView | null; now: Date }): Promise<PrintFacts> {
  const facts: PrintFacts = {
    title: a.doc.title,
    student: null,
    className: null,
    lab: null,
    version: a.version?.number ?? null,
    savedAt: a.version?.createdAt || null,
    printedAt: a.now.toISOString(),
  };
  try {
    const { program } = await api.getProgram(a.programId);
    if (a.user && program.ownerId === a.user.id) facts.student = a.user.name;
    if (program.labId) {
      const lab = await labsApi.getLab(program.labId);
      facts.lab = lab.title;
      facts.className = (await api.listClasses()).find((c) => c.id === lab.classId)?.name ?? null;
    }
  } catch {
    // Printed with what is known.
  }
  return facts;
}
