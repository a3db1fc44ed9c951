export * from './auth.js';
export * from './certificates.js';
export * from './health.js';
export * from './lab.js';
export * from './list.js';
export * from './organizations.js';
export * from './users.js';
export * from './studies.js';
