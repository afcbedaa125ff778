/** The API contract shared by the server and the client. */
export * from './errors';
export * from './health';
export * from './auth';
export * from './accounts';
export * from './programs';
export * from './classes';
export * from './mail';
export * from './labs';
export * from './invitations';
export * from './drafts';
export * from './proof';
