/**
 * `npm run cli -- create-admin --email E [--name N] [--link]`: the first administrator of a real
 * install (started with `DEMO=off`, so no demo account with a published password exists), or
 * another one later.
 *
 * The password comes piped on standard input (never as an argument, which `ps` and shell history
 * would show), or with `--link` the command makes a one-time link to set it: an invitation to the
 * administrator role, mailed (the local mailbox, or SMTP when SMTP_URL is set) and printed.
 *
 * It opens the database itself, so it takes the DATA_DIR lock like the server and refuses while a
 * server runs on that directory (the simple safe path: PGlite has no lock of its own).
 *
 * Exit codes: 0 done; 1 could not run now (a server holds DATA_DIR, the database does not open);
 * 2 bad input (arguments, environment, a weak password, an address that has an account).
 */
import { parseArgs } from 'node:util';
import { EmailSchema, PersonNameSchema } from '@shared/api/auth';
import { publicUrl, readConfig, type Config } from '../config';
import type { Clock } from '../clock';
import { acquireDataDirLock } from '../dataDirLock';
import { openDatabase, type Database } from '../db/client';
import { findUserByEmail, insertUser } from '../db/users';
import { insertToken } from '../db/oneTimeTokens';
import { DEFAULT_SCRYPT, hashPassword, type ScryptParams } from '../auth/passwords';
import { INVITE_TOKEN_MS, newToken } from '../auth/oneTimeTokens';
import { openMailer } from '../mail/openMailer';
import { invitationMail } from '../mail/templates';
import { weakPasswordReason } from './adminPassword';

export const EXIT_OK = 0;
export const EXIT_CANNOT_RUN = 1;
export const EXIT_BAD_INPUT = 2;

/** Longest standard input read as a password (the password rules stop at 200 characters). */
const MAX_STDIN_BYTES = 4096;
const DEFAULT_NAME = 'Administrator';

export const CREATE_ADMIN_USAGE = `Usage:
  printf '%s' "$PASSWORD" | npm run cli -- create-admin --email E [--name N]
  npm run cli -- create-admin --email E [--name N] --link

Creates an administrator account in DATA_DIR's database (stop the server first).
--email E   the administrator's e-mail address (must not have an account yet)
--name N    the name shown in the app (default "${DEFAULT_NAME}")
--link      instead of reading a password on standard input, make a one-time link to set it
            (valid 7 days): sent to E (the local mailbox, or SMTP when SMTP_URL is set) and printed
Exit 0 done, 1 could not run now (a server holds DATA_DIR), 2 bad input.
`;

/** The outside world of the command, passed in so tests can run it in-process. */
export interface CreateAdminDeps {
  env: Record<string, string | undefined>;
  /** Everything piped on standard input; null when standard input is a terminal. */
  readStdin(): Promise<string | null>;
  stdout(text: string): void;
  stderr(text: string): void;
  clock: Clock;
  /** Cost of the password hash; tests pass a cheap one. */
  passwordParams?: ScryptParams;
}

interface AdminRequest {
  email: string;
  name: string;
  link: boolean;
}

type Parsed = { ok: true; request: AdminRequest } | { ok: true; help: true } | { ok: false; error: string };

/** Arguments after `create-admin`. */
export function parseCreateAdminArgs(argv: readonly string[]): Parsed {
  let values;
  try {
    ({ values } = parseArgs({
      args: [...argv],
      options: { email: { type: 'string' }, name: { type: 'string' }, link: { type: 'boolean', default: false }, help: { type: 'boolean', short: 'h', default: false } },
      allowPositionals: false,
      strict: true,
    }));
  } catch (error) {
    const message = error instanceof Error ? error.message.split('\n')[0] : String(error);
    return { ok: false, error: `create-admin: ${message}\n\n${CREATE_ADMIN_USAGE}` };
  }
  if (values.help) return { ok: true, help: true };
  if (values.email === undefined) return { ok: false, error: `create-admin needs --email E\n\n${CREATE_ADMIN_USAGE}` };
  const email = EmailSchema.safeParse(values.email);
  if (!email.success) return { ok: false, error: `create-admin: --email ${JSON.stringify(values.email)}: ${email.error.issues[0]?.message}` };
  const name = PersonNameSchema.safeParse(values.name ?? DEFAULT_NAME);
  if (!name.success) return { ok: false, error: `create-admin: --name: ${name.error.issues[0]?.message}` };
  return { ok: true, request: { email: email.data, name: name.data, link: values.link === true } };
}

/** The password from piped standard input: one line, its line ending dropped. */
function passwordFrom(text: string | null): { ok: true; password: string } | { ok: false; error: string } {
  if (text === null) {
    return {
      ok: false,
      error:
        'create-admin reads the password from standard input, which is a terminal here. Pipe it in ' +
        `(printf '%s' "$PASSWORD" | npm run cli -- create-admin --email …), or use --link to set it from a one-time link.`,
    };
  }
  if (Buffer.byteLength(text) > MAX_STDIN_BYTES) return { ok: false, error: `The password on standard input is longer than ${MAX_STDIN_BYTES} bytes.` };
  const password = text.replace(/\r?\n$/, '');
  if (/[\r\n]/.test(password)) return { ok: false, error: 'Standard input holds more than one line; pipe the password alone.' };
  return { ok: true, password };
}

/** Runs `create-admin` with the arguments after it; resolves with the exit code, never throws. */
export async function createAdmin(argv: readonly string[], deps: CreateAdminDeps): Promise<number> {
  const bad = (message: string) => {
    deps.stderr(`${message}\n`);
    return EXIT_BAD_INPUT;
  };
  const parsed = parseCreateAdminArgs(argv);
  if (!parsed.ok) return bad(parsed.error);
  if ('help' in parsed) {
    deps.stdout(CREATE_ADMIN_USAGE);
    return EXIT_OK;
  }
  const { request } = parsed;
  const configResult = readConfig(deps.env);
  if (!configResult.ok) return bad(configResult.error);
  const config = configResult.config;

  let password: string | null = null;
  if (!request.link) {
    const read = passwordFrom(await deps.readStdin());
    if (!read.ok) return bad(read.error);
    const weak = weakPasswordReason(read.password, request.email);
    if (weak) return bad(`The password is too weak: ${weak}. Nothing was created.`);
    password = read.password;
  }

  // A PostgreSQL server is shared and locks its own rows; the embedded database needs DATA_DIR to itself.
  const lock = config.DATABASE_URL ? null : acquireDataDirLock(config.DATA_DIR, deps.clock.now(), 'command');
  if (lock && !lock.ok) {
    deps.stderr(`Not creating the administrator: ${lock.error}\n`);
    return EXIT_CANNOT_RUN;
  }
  const release = () => (lock?.ok ? lock.lock.release() : undefined);
  let database: Database | null = null;
  try {
    database = config.DATABASE_URL
      ? await openDatabase({ kind: 'postgres', url: config.DATABASE_URL, poolSize: 2 })
      : await openDatabase({ kind: 'directory', dataDir: config.DATA_DIR });
  } catch (error) {
    release();
    deps.stderr(`Cannot open the database ${config.DATABASE_URL ? 'at DATABASE_URL' : `in ${config.DATA_DIR}`}: ${error instanceof Error ? error.message : String(error)}\n`);
    return EXIT_CANNOT_RUN;
  }
  try {
    const existing = await findUserByEmail(database.orm, request.email);
    if (existing) return bad(`${request.email} already has an account (${existing.role}); nothing was created. Choose another address.`);
    if (password !== null) return await createWithPassword(database, config, request, password, deps);
    return await inviteByLink(database, config, request, deps);
  } catch (error) {
    deps.stderr(`create-admin failed: ${error instanceof Error ? error.message : String(error)}\n`);
    return EXIT_CANNOT_RUN;
  } finally {
    await database.close();
    release();
  }
}

async function createWithPassword(database: Database, config: Config, request: AdminRequest, password: string, deps: CreateAdminDeps): Promise<number> {
  const passwordHash = await hashPassword(password, deps.passwordParams ?? DEFAULT_SCRYPT);
  const user = await insertUser(database.orm, { email: request.email, name: request.name, role: 'admin', passwordHash, createdAt: deps.clock.now() });
  if (!user) {
    deps.stderr(`${request.email} already has an account; nothing was created.\n`);
    return EXIT_BAD_INPUT;
  }
  deps.stdout(`Created the administrator ${user.email} (${user.name}). Start the server and sign in at ${publicUrl(config)}/sign-in.\n`);
  return EXIT_OK;
}

/** An invitation to the admin role: the account is made when the link is used, with the password chosen there. */
async function inviteByLink(database: Database, config: Config, request: AdminRequest, deps: CreateAdminDeps): Promise<number> {
  const now = deps.clock.now();
  const expiresAt = new Date(now.getTime() + INVITE_TOKEN_MS);
  const { token, hash } = newToken();
  await insertToken(database.orm, { kind: 'invite', tokenHash: hash, email: request.email, role: 'admin', invitedName: request.name, expiresAt, now });
  const mail = invitationMail({ to: request.email, baseUrl: publicUrl(config), token, role: 'admin', className: null, expiresAt });
  const link = `${publicUrl(config)}/accept-invitation#token=${token}`;
  deps.stdout(`One-time link for the administrator ${request.email} (works once, until ${expiresAt.toISOString()}):\n${link}\n`);
  const mailer = await openMailer(config, database.orm, deps.clock);
  try {
    await mailer.send(mail);
    deps.stdout(mailer.kind === 'smtp' ? `The link was also mailed to ${request.email}.\n` : 'A copy is in the local mailbox (GET /api/dev/mail, for administrators).\n');
  } catch (error) {
    deps.stderr(`The link could not be mailed (${error instanceof Error ? error.message : String(error)}); use the one printed above.\n`);
  } finally {
    await mailer.close();
  }
  return EXIT_OK;
}

/** Standard input as the command reads it in a real process. */
export async function readPipedStdin(): Promise<string | null> {
  if (process.stdin.isTTY) return null;
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of process.stdin) {
    const buffer = Buffer.isBuffer(chunk) ? chunk : Buffer.from(String(chunk));
    size += buffer.length;
    chunks.push(buffer);
    // Past the limit the rest is not needed: the password is refused as too long.
    if (size > MAX_STDIN_BYTES) break;
  }
  return Buffer.concat(chunks).toString('utf8');
}
