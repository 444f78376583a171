import { loadConfig } from '../config.js';
import { createDataSource } from './create-data-source.js';

// The default export is for scripts, tests and the TypeORM CLI, which read the environment themselves; the server
// (`npm start`) builds its data source from the configuration it loaded and checked once (create-data-source.ts).
export default createDataSource(loadConfig());
