import { randomBytes, randomUUID } from 'node:crypto';

export const newId = () => randomUUID();

/** An unguessable token (256 bits) for links sent outside the app. */
export const newToken = () => randomBytes(32).toString('base64url');
