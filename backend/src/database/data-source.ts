import { createDataSource } from './create-data-source.js';

// Entry point for the TypeORM CLI: `npm run typeorm -w backend -- migration:generate --dr x`.
export default createDataSource();
