/** Console API addresses for keys and usage. */
export const keyPaths = {
  keys: '/console-api/keys',
  revoke: (id: string) => `/console-api/keys/${encodeURIComponent(id)}/revoke`,
  rotate: (id: string) => `/console-api/keys/${encodeURIComponent(id)}/rotate`,
  usage: '/console-api/usage',
  requests: '/console-api/requests',
} as const;
