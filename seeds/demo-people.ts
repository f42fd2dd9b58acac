/**
 * The invented demo firm and its people. Names, addresses and passwords are made up for the demo;
 * the addresses use the reserved `.example` domain.
 */
import type { Role } from '@shared/api/roles';

export const DEMO_ORG = { id: '6a0f4c59-2f43-4c8e-9a55-0d3f5b1c7e01', name: 'Skerrow Marine Salvage' };
/** A second firm, so the demo and the tests can show that firms never see each other's work. */
export const OTHER_ORG = { id: '6a0f4c59-2f43-4c8e-9a55-0d3f5b1c7e02', name: 'Halden Towage & Recovery' };

export interface DemoUser {
  id: string;
  orgId: string;
  name: string;
  email: string;
  password: string;
  role: Role;
}

export const DEMO_USERS: DemoUser[] = [
  {
    id: '1b7d2e40-5c11-4f0a-8e3e-6f1d0a9b2c01',
    orgId: DEMO_ORG.id,
    name: 'Moira Lennox',
    email: 'moira.lennox@skerrow.example',
    password: 'brine-admin-2026',
    role: 'admin',
  },
  {
    id: '1b7d2e40-5c11-4f0a-8e3e-6f1d0a9b2c02',
    orgId: DEMO_ORG.id,
    name: 'Tomas Varga',
    email: 'tomas.varga@skerrow.example',
    password: 'brine-engineer-2026',
    role: 'engineer',
  },
  {
    id: '1b7d2e40-5c11-4f0a-8e3e-6f1d0a9b2c03',
    orgId: DEMO_ORG.id,
    name: 'Ines Achterberg',
    email: 'ines.achterberg@skerrow.example',
    password: 'brine-surveyor-2026',
    role: 'surveyor',
  },
  {
    id: '1b7d2e40-5c11-4f0a-8e3e-6f1d0a9b2c04',
    orgId: OTHER_ORG.id,
    name: 'Per Solheim',
    email: 'per.solheim@halden.example',
    password: 'halden-admin-2026',
    role: 'admin',
  },
];
