/**
 * The caution every lab shows (docs/names-and-rules.md, "Facts of the trade"): one plain line and the standards.
 * In a module of its own because the browser needs it (lab pages, a new lab's brief) and must
 * not load the standard labs to get it: their check scripts and reference solutions are
 * server-only (see README.md).
 */
export const SAFETY_CAUTION = [
  '> **Safety.** A simulator does not replace lockout/tagout. On a real panel, de-energise and lock out / tag out',
  '> (OSHA 29 CFR 1910.147, CSA Z460), work to NFPA 70E / CSA Z462, keep the emergency stop hardwired and never rely on',
  '> a PLC program for it (NFPA 79, IEC 60204-1, ISO 13850), clear and stop a controller\'s program before powering it',
  '> on a panel, and defer to local codes and licensed practice.',
].join('\n');
