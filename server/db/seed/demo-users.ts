import type { Role } from '../../../shared/schemas/roles.js';

// Demo sign-ins of the invented utility "Kestrel Valley Power", one per role. Created only with the demo data.
export const DEMO_PASSWORD = 'gapsight-demo';

export const DEMO_USERS: { email: string; name: string; roles: Role[]; allSites: boolean }[] = [
  { email: 'admin@kestrel-valley.example', name: 'Avery Admin (demo)', roles: ['admin'], allSites: true },
  { email: 'protection@kestrel-valley.example', name: 'Priya Protection (demo)', roles: ['protection'], allSites: true },
  { email: 'tester@kestrel-valley.example', name: 'Theo Tester (demo)', roles: ['tester'], allSites: true },
  { email: 'manager@kestrel-valley.example', name: 'Morgan Manager (demo)', roles: ['manager'], allSites: true },
  { email: 'engineer@kestrel-valley.example', name: 'Elena Engineer (demo)', roles: ['engineer'], allSites: true },
];
