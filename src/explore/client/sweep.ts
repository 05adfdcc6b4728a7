// The sweep section (placeholder until the sweep page is built).
import type { PageData, SweepData } from '../payload.js';

export function sweepSection(_sweep: SweepData, _data: PageData, _main: HTMLElement): void {}
