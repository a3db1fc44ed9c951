export type HealthResponse = { status: 'ok' | 'degraded'; database: 'up' | 'down'; version: string };
