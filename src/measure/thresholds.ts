// Logic input thresholds (VIH / VIL): presets named after the supply and the JEDEC JESD8 family of
// interface standards for non-terminated (LVCMOS) inputs, and explicit values.
//
// Sources (see docs/measurements.md): the JEDEC documents themselves were not read. Each preset's values
// are the ones FPGA vendors publish for the I/O standard of that name, and the supply-to-document
// mapping (JESD8C.01, JESD8-5A.01, JESD8-7A, JESD8-11A.01, JESD8-12A.01) is the one listed in the
// Wikipedia "LVCMOS" article; `confirmedBy` names what was checked, `fromMemory` marks what was not.

export interface LogicThresholds {
  /** Minimum input voltage read as high (V). */
  vih: number;
  /** Maximum input voltage read as low (V). */
  vil: number;
  /** Preset name when the thresholds came from a preset. */
  preset?: string;
  /** Supply the thresholds were computed for (V), for presets. */
  vdd?: number;
  /** The standard the preset follows, e.g. "JEDEC JESD8C.01 (LVCMOS 3.3 V)". */
  standard?: string;
}

export interface ThresholdPreset {
  name: string;
  title: string;
  standard: string;
  /** Nominal supply (V). */
  vdd: number;
  /** VIH/VIL as fixed volts, or as fractions of VDD. */
  vih: { volts: number } | { ofVdd: number };
  vil: { volts: number } | { ofVdd: number };
  /** Where the values were confirmed; `fromMemory` when they could not be. */
  confirmedBy: string;
  fromMemory: boolean;
}

export const THRESHOLD_PRESETS: Readonly<Record<string, ThresholdPreset>> = {
  lvcmos33: {
    name: 'lvcmos33',
    title: 'LVCMOS 3.3 V',
    standard: 'JEDEC JESD8C.01 (3.3 V ± 0.3 V, LVCMOS/LVTTL inputs)',
    vdd: 3.3,
    vih: { volts: 2.0 },
    vil: { volts: 0.8 },
    confirmedBy:
      'device data sheets quoting LVCMOS 3.3 V input levels VIH 2.0 V / VIL 0.8 V (e.g. TI TUSB2136, Oxford OXCB950); ' +
      'JESD8C.01 text itself not read — values from memory of the standard',
    fromMemory: true,
  },
  lvcmos25: {
    name: 'lvcmos25',
    title: 'LVCMOS 2.5 V',
    standard: 'JEDEC JESD8-5A.01 (2.5 V ± 0.2 V)',
    vdd: 2.5,
    vih: { volts: 1.7 },
    vil: { volts: 0.7 },
    confirmedBy: 'Microchip IGLOO nano / PolarFire I/O tables, "2.5 V LVCMOS (JESD8-5)": VIL max 0.7 V, VIH min 1.7 V',
    fromMemory: false,
  },
  lvcmos18: {
    name: 'lvcmos18',
    title: 'LVCMOS 1.8 V',
    standard: 'JEDEC JESD8-7A (1.8 V ± 0.15 V)',
    vdd: 1.8,
    vih: { ofVdd: 0.65 },
    vil: { ofVdd: 0.35 },
    confirmedBy: 'Intel and Microchip FPGA I/O tables for 1.8 V LVCMOS: VIL max 0.35·VCCIO, VIH min 0.65·VCCIO',
    fromMemory: false,
  },
  lvcmos15: {
    name: 'lvcmos15',
    title: 'LVCMOS 1.5 V',
    standard: 'JEDEC JESD8-11A.01 (1.5 V ± 0.1 V)',
    vdd: 1.5,
    vih: { ofVdd: 0.65 },
    vil: { ofVdd: 0.35 },
    confirmedBy: 'Microchip PolarFire I/O table "1.5 V LVCMOS (JESD8-11)": VIL max 0.35·VCC, VIH min 0.65·VCC',
    fromMemory: false,
  },
  lvcmos12: {
    name: 'lvcmos12',
    title: 'LVCMOS 1.2 V',
    standard: 'JEDEC JESD8-12A.01 (1.2 V ± 0.1 V)',
    vdd: 1.2,
    vih: { ofVdd: 0.65 },
    vil: { ofVdd: 0.35 },
    confirmedBy: 'Microchip IGLOO nano data sheet "1.2 V LVCMOS (JESD8-12A)": VIL max 0.35·VCCI, VIH min 0.65·VCCI',
    fromMemory: false,
  },
};

/** Other spellings accepted for the preset names (case-insensitive; spaces, dots, "-" and "_" ignored). */
const ALIASES: Record<string, string> = {
  lvcmos33: 'lvcmos33',
  lvcmos3v3: 'lvcmos33',
  '33v': 'lvcmos33',
  '3v3': 'lvcmos33',
  lvcmos25: 'lvcmos25',
  lvcmos2v5: 'lvcmos25',
  '25v': 'lvcmos25',
  '2v5': 'lvcmos25',
  lvcmos18: 'lvcmos18',
  lvcmos1v8: 'lvcmos18',
  '18v': 'lvcmos18',
  '1v8': 'lvcmos18',
  lvcmos15: 'lvcmos15',
  lvcmos1v5: 'lvcmos15',
  '15v': 'lvcmos15',
  '1v5': 'lvcmos15',
  lvcmos12: 'lvcmos12',
  lvcmos1v2: 'lvcmos12',
  '12v': 'lvcmos12',
  '1v2': 'lvcmos12',
};

/** The preset for a name such as "lvcmos33", "LVCMOS-3.3", "3.3V"; undefined if unknown. */
export function findPreset(name: string): ThresholdPreset | undefined {
  const key = name.toLowerCase().replace(/[\s._-]/g, '');
  const canonical = ALIASES[key];
  return canonical ? THRESHOLD_PRESETS[canonical] : undefined;
}

export function presetNames(): string[] {
  return Object.keys(THRESHOLD_PRESETS);
}

/**
 * Thresholds of a preset. `vdd` overrides the nominal supply for the presets whose levels scale with
 * VDD (1.8 V and below); for fixed-level presets it is recorded but does not change VIH/VIL.
 */
export function presetThresholds(name: string, vdd?: number): LogicThresholds {
  const p = findPreset(name);
  if (!p) throw new RangeError(`unknown threshold preset "${name}"; known: ${presetNames().join(', ')}`);
  const supply = vdd ?? p.vdd;
  if (!(supply > 0)) throw new RangeError(`vdd must be positive, got ${vdd}`);
  const at = (x: { volts: number } | { ofVdd: number }): number => ('volts' in x ? x.volts : x.ofVdd * supply);
  return { vih: at(p.vih), vil: at(p.vil), preset: p.name, vdd: supply, standard: p.standard };
}

/** What a scenario may give: a preset name, a preset with a supply, or explicit levels (volts). */
export type ThresholdSpec = string | { preset: string; vdd?: number } | { vih: number; vil: number } | LogicThresholds;

/** Problems with a threshold spec (empty when valid). */
export function thresholdProblems(spec: ThresholdSpec): string[] {
  try {
    resolveThresholds(spec);
    return [];
  } catch (err) {
    return [(err as Error).message];
  }
}

/** Resolve a spec to VIH/VIL; throws RangeError on an unknown preset or on vil ≥ vih. */
export function resolveThresholds(spec: ThresholdSpec): LogicThresholds {
  const t: LogicThresholds =
    typeof spec === 'string'
      ? presetThresholds(spec)
      : 'vih' in spec
        ? { ...spec }
        : presetThresholds(spec.preset, spec.vdd);
  if (!Number.isFinite(t.vih) || !Number.isFinite(t.vil)) throw new RangeError('vih and vil must be finite numbers (volts)');
  if (!(t.vil < t.vih)) throw new RangeError(`vil (${t.vil} V) must be below vih (${t.vih} V)`);
  return t;
}
