/**
 * The demo sign-ins seeded on first start (demo only: the README prints these passwords). All of
 * them belong to the invented Larch Hollow Timber Co. scenario; the `.example` domain is reserved
 * (RFC 2606), so no mail to them can reach anyone.
 */
export interface DemoAccount {
  email: string;
  name: string;
  role: 'student' | 'instructor' | 'admin';
  password: string;
}

export const DEMO_ADMIN: DemoAccount = {
  email: 'admin@larch-hollow.example',
  name: 'Dana Okafor (demo admin)',
  role: 'admin',
  password: 'demo-admin-larch',
};

export const DEMO_INSTRUCTOR: DemoAccount = {
  email: 'instructor@larch-hollow.example',
  name: 'Marek Lindqvist (demo instructor)',
  role: 'instructor',
  password: 'demo-instructor-larch',
};

export const DEMO_STUDENTS: readonly DemoAccount[] = [
  { email: 'ana.reyes@larch-hollow.example', name: 'Ana Reyes (demo student)', role: 'student', password: 'demo-student-larch' },
  { email: 'tom.becker@larch-hollow.example', name: 'Tom Becker (demo student)', role: 'student', password: 'demo-student-larch' },
  { email: 'priya.nair@larch-hollow.example', name: 'Priya Nair (demo student)', role: 'student', password: 'demo-student-larch' },
];

/** The demo class and its join code (students can sign up with it). */
export const DEMO_CLASS = {
  name: 'Motor Control 1 — reversing conveyor (demo)',
  term: 'Demo term',
  joinCode: 'LARCH-CONVEY',
} as const;

export const DEMO_ACCOUNTS: readonly DemoAccount[] = [DEMO_ADMIN, DEMO_INSTRUCTOR, ...DEMO_STUDENTS];
