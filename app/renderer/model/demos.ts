/** The demonstration scenarios shipped in scenarios/ (invented data), offered to start from. */
import plant from '../../../scenarios/plant-room-supply-silencer.json';
import kitchen from '../../../scenarios/kitchen-extract-stub-resonator.json';
import plenum from '../../../scenarios/office-plenum-offset-ports.json';
import generator from '../../../scenarios/generator-room-small.json';
import lined from '../../../scenarios/ahu-discharge-lined-plenum.json';
import type { Draft } from './draft.ts';

export interface Demo { id: string; fileName: string; label: string; draft: Draft }

export const DEMOS: readonly Demo[] = [
  { id: 'plant-room-supply-silencer', fileName: 'plant-room-supply-silencer.json', label: 'Expansion chamber on a plant-room supply', draft: plant as unknown as Draft },
  { id: 'kitchen-extract-stub-resonator', fileName: 'kitchen-extract-stub-resonator.json', label: 'Quarter-wave side branch on a kitchen extract', draft: kitchen as unknown as Draft },
  { id: 'office-plenum-offset-ports', fileName: 'office-plenum-offset-ports.json', label: 'Supply plenum with offset spigots', draft: plenum as unknown as Draft },
  { id: 'ahu-discharge-lined-plenum', fileName: 'ahu-discharge-lined-plenum.json', label: 'Lined discharge plenum of an air-handling unit', draft: lined as unknown as Draft },
  { id: 'generator-room-small', fileName: 'generator-room-small.json', label: 'Small generator room with an open louvre', draft: generator as unknown as Draft },
];

export const DEFAULT_DEMO = DEMOS[0];

export function demoById(id: string): Demo | undefined {
  return DEMOS.find((d) => d.id === id);
}
