import type { Role } from '../../../shared/schemas/auth.schema';

/**
 * The demo scenario's people (Harrow Creek Instruments, an invented instrument maker). These
 * accounts exist only when the demo seed runs (`npm start` runs it; a production install does not).
 */
export const DEMO_PASSWORD = 'harrow-creek-demo';

export const DEMO_USERS: { email: string; name: string; roles: Role[] }[] = [
  { email: 'ada@harrowcreek.example', name: 'Ada Lindqvist', roles: ['admin'] },
  { email: 'ellis@harrowcreek.example', name: 'Ellis Okafor', roles: ['engineer'] },
  { email: 'rowan@harrowcreek.example', name: 'Rowan Pike', roles: ['engineer'] },
  { email: 'lena@harrowcreek.example', name: 'Lena Marsh', roles: ['librarian'] },
  { email: 'otto@harrowcreek.example', name: 'Otto Brandt', roles: ['operator'] },
];
