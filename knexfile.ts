// The migration CLI's settings: `npm run migrate` (through tsx, since Node 20 cannot load .ts).
import { databaseConfig } from './src/lib/server/db/config';

export default databaseConfig();
