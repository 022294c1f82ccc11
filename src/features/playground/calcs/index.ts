/** Every calculation of the playground, in the order the API reference lists them. */
import type { CalcDefinition } from '../definition.ts';
import { capacityTest } from './capacity-test.tsx';
import { chargeTime } from './charge-time.tsx';
import { compatibility } from './compatibility.tsx';
import { fuseSize } from './fuse-size.tsx';
import { packCompare } from './pack-compare.tsx';
import { packEnergy } from './pack-energy.tsx';
import { parallelConnect } from './parallel-connect.tsx';
import { parallelShare } from './parallel-share.tsx';
import { runtime } from './runtime.tsx';
import { wireSize } from './wire-size.tsx';

export const calculations = [packEnergy, packCompare, runtime, chargeTime, capacityTest, wireSize, fuseSize, parallelShare, parallelConnect, compatibility] as unknown as CalcDefinition[];
