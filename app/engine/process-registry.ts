import type { ProcessDefinition, ProcessId, ProcessInfo } from "./process-definition";
import { bhabha } from "./processes/bhabha";
import { breitWheeler } from "./processes/breit-wheeler";
import { compton } from "./processes/compton";
import { moller } from "./processes/moller";
import { muonPair } from "./processes/muon-pair";
import { pairAnnihilation } from "./processes/pair-annihilation";
import { photonFusionScalar } from "./processes/photon-fusion-scalar";
import { scalarAnnihilation } from "./processes/scalar-annihilation";
import { scalarCompton } from "./processes/scalar-compton";
import { scalarPairProduction } from "./processes/scalar-pair-production";

/** The ten processes, in the order the Predictions page lists them. */
export const PROCESS_DEFINITIONS: readonly ProcessDefinition[] = [
  scalarAnnihilation,
  scalarCompton,
  photonFusionScalar,
  scalarPairProduction,
  pairAnnihilation,
  compton,
  breitWheeler,
  muonPair,
  bhabha,
  moller,
];

/** The conventions of every process, for the page that prints them. */
export const PROCESSES: readonly ProcessInfo[] = PROCESS_DEFINITIONS.map((d) => d.info);

export function findProcess(id: string): ProcessDefinition | undefined {
  return PROCESS_DEFINITIONS.find((d) => d.info.id === (id as ProcessId));
}
