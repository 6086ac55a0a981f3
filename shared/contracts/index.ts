// Every contract of the API, by area; the contract test walks them against app.routes.
import type { Contract } from './contract';
import { attachmentsContracts } from './attachments';
import { auditContracts } from './audit';
import { authContracts } from './auth';
import { boardContracts } from './board';
import { certificatesContracts } from './certificates';
import { equipmentContracts } from './equipment';
import { equipmentImportContracts } from './equipment-import';
import { faultLocationContracts } from './fault-location';
import { faultsContracts } from './faults';
import { healthContracts } from './health';
import { labelsContracts } from './labels';
import { incidentsContracts } from './incidents';
import { mailContracts } from './mail';
import { planContracts } from './plan';
import { profilesContracts } from './profiles';
import { readingsContracts } from './readings';
import { readingsTableContracts } from './readings-table';
import { signOffContracts } from './sign-off';
import { stripsContracts } from './strips';
import { usersContracts } from './users';
import { venuesContracts } from './venues';

export const contractsByArea = {
  attachments: attachmentsContracts,
  audit: auditContracts,
  auth: authContracts,
  board: boardContracts,
  certificates: certificatesContracts,
  equipment: equipmentContracts,
  equipmentImport: equipmentImportContracts,
  faultLocation: faultLocationContracts,
  faults: faultsContracts,
  health: healthContracts,
  labels: labelsContracts,
  incidents: incidentsContracts,
  mail: mailContracts,
  plan: planContracts,
  profiles: profilesContracts,
  readings: readingsContracts,
  readingsTable: readingsTableContracts,
  signOff: signOffContracts,
  strips: stripsContracts,
  users: usersContracts,
  venues: venuesContracts,
};

const isContract = (v: unknown): v is Contract => typeof v === 'object' && v !== null && 'method' in v && 'path' in v && 'answer' in v;

/** Every contract, however an area nests them (attachments has one group per kind of owner). */
export function allContracts(): Contract[] {
  const out: Contract[] = [];
  const walk = (v: unknown) => {
    if (isContract(v)) out.push(v);
    else if (typeof v === 'object' && v !== null) Object.values(v).forEach(walk);
  };
  walk(contractsByArea);
  return out;
}
