/**
 * What other features (admin, rooms, workshops) use of accounts and their link tokens. The account
 * rows are read and written in auth/store.ts, which no other feature imports.
 */
export { findUserByEmail, findUserById, lockUserById, updateUser, type UserRow } from './store';
export { issueToken, latestInvites, revokeTokens, type TokenRow } from './tokens';
