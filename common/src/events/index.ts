/** Socket.io namespaces and event names shared by the server, the bridge and the browser. */
export const NAMESPACES = { ingest: '/ingest', live: '/live' } as const;
