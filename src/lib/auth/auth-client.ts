/** The only auth module a browser island imports. */
import { createAuthClient } from 'better-auth/react';
import { organizationClient } from 'better-auth/client/plugins';

export const authClient = createAuthClient({ plugins: [organizationClient()] });
