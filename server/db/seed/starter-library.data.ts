// The starter library seeded with the demo (Harrow Creek Instruments, an invented scenario), in
// the library file format (shared/schemas/README.md). Every value names its source in the package's `notes`:
//   - chip body sizes: exactly shared/README.md, "Check values and their sources" (EIA-198 / IEC 60115-8 size codes, from memory)
//   - SOT-23 (JEDEC TO-236) and SOIC-8 (JEDEC MS-012): shared/README.md, "Check values and their sources", from memory
//   - other bodies: the JEDEC outline or a typical maker datasheet, as named, from memory
//   - heights: typical, from memory
//   - tape widths and pocket pitches: EIA-481, from memory
//   - courtyard 0.25 mm: IPC-7351B density level B, from memory (0.5 mm, level A, for tall parts)
//   - nozzle lists, vision presets, rotation offsets, machine profiles: the demo's own
// The entries of samples/library.json are reused as they are (names, aliases, sizes, nozzles), so
// every footprint of the demo's centroid files matches a package or alias (the planted
// TERMBLOCK-5MM of samples/faulty excepted: it is meant to match nothing).

const CHIP = 'EIA-198 / IEC 60115-8 size codes, from memory';
const H = 'height typical, from memory';
const TAPE = 'tape EIA-481, from memory';
const CY_B = 'courtyard IPC-7351B level B, from memory';
const CY_A = 'courtyard IPC-7351B level A (tall part), from memory';
const OWN = "nozzles, vision preset and rotation offset: the demo's own";

type Family = 'chip' | 'MELF' | 'SOD' | 'SOT' | 'SOIC' | 'SSOP/TSSOP' | 'QFN/DFN' | 'QFP' | 'BGA' | 'electrolytic' | 'crystal' | 'connector' | 'other';

interface Pkg {
  name: string;
  aliases: string[];
  family: Family;
  body: { length: number; width: number; height: number; offsetX: number; offsetY: number };
  courtyard: number;
  rotationOffset: number;
  polarised: boolean;
  overhang: boolean;
  nozzles: string[];
  vision: string;
  tape?: { width: number; pitch: number };
  feeder: 'tape' | 'strip' | 'tray' | 'tube';
  pads?: { length?: number; width?: number; count?: number };
  notes: string;
}

function pkg(
  name: string,
  family: Family,
  [length, width, height]: [number, number, number],
  o: { aliases?: string[]; nozzles: string[]; vision: string; tape?: [number, number]; body: string; courtyard?: number; rotationOffset?: number; polarised?: boolean; offset?: [number, number]; feeder?: Pkg['feeder']; pads?: Pkg['pads']; extra?: string },
): Pkg {
  const courtyard = o.courtyard ?? 0.25;
  return {
    name,
    aliases: o.aliases ?? [],
    family,
    body: { length, width, height, offsetX: o.offset?.[0] ?? 0, offsetY: o.offset?.[1] ?? 0 },
    courtyard,
    rotationOffset: o.rotationOffset ?? 0,
    polarised: o.polarised ?? false,
    overhang: false,
    nozzles: o.nozzles,
    vision: o.vision,
    ...(o.tape ? { tape: { width: o.tape[0], pitch: o.tape[1] } } : {}),
    feeder: o.feeder ?? 'tape',
    ...(o.pads ? { pads: o.pads } : {}),
    notes: [`Sources: body ${o.body}`, H, ...(o.tape ? [TAPE] : []), courtyard === 0.25 ? CY_B : courtyard === 0.5 ? CY_A : "courtyard: the demo's own", OWN].join('; ') + (o.extra ? `. ${o.extra}` : '.'),
  };
}

// ---- two-terminal chips (sizes: shared/README.md, "Check values and their sources")
const SIZES: [eia: string, metric: string, l: number, w: number][] = [
  ['01005', '0402M', 0.4, 0.2],
  ['0201', '0603M', 0.6, 0.3],
  ['0402', '1005M', 1.0, 0.5],
  ['0603', '1608M', 1.6, 0.8],
  ['0805', '2012M', 2.0, 1.25],
  ['1206', '3216M', 3.2, 1.6],
  ['1210', '3225M', 3.2, 2.5],
  ['2010', '5025M', 5.0, 2.5],
  ['2512', '6332M', 6.3, 3.2],
];
export const CHIP_SIZES = SIZES;

function chipSetup(eia: string): { nozzles: string[]; vision: string; tape: [number, number] } {
  switch (eia) {
    // samples/library.json lists a wider second nozzle for 0402 and 0603 (N07, N10); the starter
    // keeps the first choice only, since those tips are wider than the body (shared/README.md, "Library assignment").
    case '01005': return { nozzles: ['N02'], vision: 'chip-small', tape: [8, 2] };
    case '0201': return { nozzles: ['N03'], vision: 'chip-small', tape: [8, 2] };
    case '0402': return { nozzles: ['N05'], vision: 'chip-small', tape: [8, 2] };
    case '0603': return { nozzles: ['N07'], vision: 'chip-small', tape: [8, 4] };
    case '0805': return { nozzles: ['N10', 'N07'], vision: 'chip-medium', tape: [8, 4] };
    case '1206': return { nozzles: ['N14', 'N10'], vision: 'chip-medium', tape: [8, 4] };
    case '1210': return { nozzles: ['N14'], vision: 'chip-medium', tape: [8, 4] };
    default: return { nozzles: ['N25'], vision: 'chip-large', tape: [12, 4] };
  }
}

// Resistor heights (thin film) and capacitor heights (MLCC, about the width), typical, from memory.
const R_HEIGHT: Record<string, number> = { '01005': 0.13, '0201': 0.23, '0402': 0.35, '0603': 0.45, '0805': 0.5, '1206': 0.55, '1210': 0.55, '2010': 0.55, '2512': 0.6 };
const C_HEIGHT: Record<string, number> = { '01005': 0.2, '0201': 0.3, '0402': 0.5, '0603': 0.8, '0805': 1.25, '1206': 1.6, '1210': 2.5 };

// Aliases of the sample library (samples/library.json), kept as they are.
const SAMPLE_ALIASES: Record<string, string[]> = {
  R0402: ['RES-0402*', 'R_0402'], C0402: ['CAP-0402*', 'C_0402'], R0603: ['RES-0603*'], C0603: ['CAP-0603*'], LED0603: ['LED-0603*'],
  R0805: ['RES-0805*'], C0805: ['CAP-0805*'], C1206: ['CAP-1206*'], C1210: ['CAP-1210*'], R2512: ['RES-2512*'],
};
const aliasesOf = (name: string, eia: string, metric: string, prefix: 'R' | 'C' | 'LED') =>
  SAMPLE_ALIASES[name] ?? [`${prefix === 'LED' ? 'LED' : prefix === 'R' ? 'RES' : 'CAP'}-${eia}*`, `${prefix}_${eia}`, `${prefix}${metric}`];

const chips: Pkg[] = [
  ...SIZES.map(([eia, metric, l, w]) =>
    pkg(`R${eia}`, 'chip', [l, w, R_HEIGHT[eia]], { aliases: aliasesOf(`R${eia}`, eia, metric, 'R'), ...chipSetup(eia), body: `${CHIP}, ${eia} (${metric})`, pads: { count: 2 } }),
  ),
  ...SIZES.filter(([eia]) => C_HEIGHT[eia] !== undefined).map(([eia, metric, l, w]) =>
    pkg(`C${eia}`, 'chip', [l, w, C_HEIGHT[eia]], { aliases: aliasesOf(`C${eia}`, eia, metric, 'C'), ...chipSetup(eia), body: `${CHIP}, ${eia} (${metric})`, pads: { count: 2 } }),
  ),
  // Chip LEDs: cathode on the left at zero orientation (IPC-7351B, from memory).
  ...SIZES.filter(([eia]) => ['0402', '0603', '0805', '1206'].includes(eia)).map(([eia, metric, l, w]) =>
    pkg(`LED${eia}`, 'chip', [l, w, { '0402': 0.4, '0603': 0.6, '0805': 0.8, '1206': 1.1 }[eia]!], {
      aliases: aliasesOf(`LED${eia}`, eia, metric, 'LED'), ...chipSetup(eia), nozzles: eia === '0603' ? ['N07'] : chipSetup(eia).nozzles, polarised: true, body: `${CHIP}, ${eia} (${metric})`, pads: { count: 2 },
    }),
  ),
  pkg('L0805', 'chip', [2.0, 1.25, 0.9], { aliases: ['IND-0805*', 'L_0805'], nozzles: ['N10'], vision: 'chip-medium', tape: [8, 4], body: `${CHIP}, 0805 (2012M)` }),
  pkg('L1210', 'chip', [3.2, 2.5, 2.0], { aliases: ['IND-1210*', 'L_1210'], nozzles: ['N14'], vision: 'chip-medium', tape: [8, 4], body: `${CHIP}, 1210 (3225M)` }),
  pkg('TANT-A', 'chip', [3.2, 1.6, 1.6], { aliases: ['CASE-A-3216*', 'TANT-3216*'], nozzles: ['N14', 'N10'], vision: 'chip-medium', tape: [8, 4], polarised: true, body: 'EIA-535BAAC case A (3216-18), from memory' }),
  pkg('TANT-B', 'chip', [3.5, 2.8, 1.9], { aliases: ['CASE-B-3528*', 'TANT-3528*'], nozzles: ['N14'], vision: 'chip-medium', tape: [8, 4], polarised: true, body: 'EIA-535BAAC case B (3528-21), from memory' }),
  pkg('LED-PLCC2-3528', 'chip', [3.5, 2.8, 1.9], { aliases: ['PLCC2*', 'LED-3528*'], nozzles: ['N14'], vision: 'chip-medium', tape: [8, 4], polarised: true, body: 'typical maker datasheet (3.5 × 2.8 PLCC-2), from memory' }),
  pkg('LED-5050', 'chip', [5.0, 5.0, 1.6], { aliases: ['LED-5050*', 'PLCC6-5050*'], nozzles: ['N25'], vision: 'chip-large', tape: [12, 8], polarised: true, body: 'typical maker datasheet (5.0 × 5.0 PLCC-6), from memory' }),
];

const MEM = 'typical maker datasheet, from memory';

const discretes: Pkg[] = [
  pkg('MINIMELF', 'MELF', [3.5, 1.5, 1.5], { aliases: ['SOD-80*', 'MINIMELF*', 'LL-34*'], nozzles: ['N10'], vision: 'chip-medium', tape: [8, 4], polarised: true, body: 'JEDEC DO-213AA (SOD-80), from memory' }),
  pkg('MELF', 'MELF', [5.0, 2.5, 2.5], { aliases: ['DO-213AB*', 'MELF-0207*'], nozzles: ['N14'], vision: 'chip-large', tape: [12, 4], polarised: true, body: 'JEDEC DO-213AB, from memory' }),
  pkg('SOD-123', 'SOD', [2.7, 1.6, 1.1], { aliases: ['SOD123'], nozzles: ['N10'], vision: 'lead-row', tape: [8, 4], polarised: true, body: MEM }),
  pkg('SOD-323', 'SOD', [1.7, 1.25, 0.95], { aliases: ['SOD323', 'SC-76*'], nozzles: ['N07'], vision: 'lead-row', tape: [8, 4], polarised: true, body: MEM }),
  pkg('SOD-523', 'SOD', [1.2, 0.8, 0.6], { aliases: ['SOD523', 'SC-79*'], nozzles: ['N05'], vision: 'chip-small', tape: [8, 2], polarised: true, body: MEM }),
  pkg('SMA', 'SOD', [4.3, 2.6, 2.3], { aliases: ['DO-214AC'], nozzles: ['N14'], vision: 'chip-large', tape: [12, 4], polarised: true, body: 'JEDEC DO-214AC, ' + MEM }),
  pkg('SMB', 'SOD', [4.3, 3.6, 2.3], { aliases: ['DO-214AA'], nozzles: ['N25'], vision: 'chip-large', tape: [12, 8], polarised: true, body: 'JEDEC DO-214AA, ' + MEM }),
  pkg('SMC', 'SOD', [6.9, 5.9, 2.3], { aliases: ['DO-214AB'], nozzles: ['N25', 'N40'], vision: 'chip-large', tape: [16, 8], polarised: true, body: 'JEDEC DO-214AB, ' + MEM }),
  pkg('SOT-23', 'SOT', [2.9, 1.3, 1.0], { aliases: ['SOT23', 'SOT-23-*'], nozzles: ['N07'], vision: 'lead-row', tape: [8, 4], rotationOffset: -90, polarised: true, pads: { count: 3 }, body: 'JEDEC TO-236, from memory', extra: 'The demo CAD library draws it pin 1 at the lower left, hence the rotation offset of −90° (as samples/library.json)' }),
  pkg('SOT-23-5', 'SOT', [2.9, 1.6, 1.1], { aliases: ['SOT23-5', 'SOT-23-5-*', 'SC-74A*'], nozzles: ['N07', 'N10'], vision: 'lead-row', tape: [8, 4], polarised: true, pads: { count: 5 }, body: 'JEDEC MO-178, from memory' }),
  pkg('SOT-23-6', 'SOT', [2.9, 1.6, 1.1], { aliases: ['SOT23-6', 'SOT-23-6-*', 'SC-74*'], nozzles: ['N07', 'N10'], vision: 'lead-row', tape: [8, 4], polarised: true, pads: { count: 6 }, body: 'JEDEC MO-178, from memory' }),
  pkg('SOT-323', 'SOT', [2.0, 1.25, 0.95], { aliases: ['SOT323', 'SC-70', 'SC-70-3*'], nozzles: ['N07'], vision: 'lead-row', tape: [8, 4], polarised: true, pads: { count: 3 }, body: 'JEDEC MO-203 (SC-70), from memory' }),
  pkg('SOT-363', 'SOT', [2.0, 1.25, 0.95], { aliases: ['SOT363', 'SC-70-6*', 'SC-88*'], nozzles: ['N07'], vision: 'lead-row', tape: [8, 4], polarised: true, pads: { count: 6 }, body: 'JEDEC MO-203 (SC-70-6), from memory' }),
  pkg('SOT-89', 'SOT', [4.5, 2.5, 1.5], { aliases: ['SOT89', 'SOT-89-*'], nozzles: ['N14', 'N25'], vision: 'lead-row', tape: [12, 8], polarised: true, pads: { count: 3 }, body: 'JEDEC TO-243, from memory' }),
  pkg('SOT-223', 'SOT', [6.5, 3.5, 1.7], { aliases: ['SOT223'], nozzles: ['N25'], vision: 'lead-row', tape: [12, 8], polarised: true, pads: { count: 4 }, body: 'JEDEC TO-261, ' + MEM }),
];

const ics: Pkg[] = [
  pkg('SOIC-8', 'SOIC', [4.9, 3.9, 1.75], { aliases: ['SOIC8', 'SOIC-8-*'], nozzles: ['N14', 'N10'], vision: 'lead-row', tape: [12, 8], polarised: true, pads: { length: 1.55, width: 0.6, count: 8 }, body: 'JEDEC MS-012 AA, from memory: 4.9 × 3.9, 6.0 across the leads' }),
  pkg('SOIC-14', 'SOIC', [8.65, 3.9, 1.75], { aliases: ['SOIC14', 'SOIC-14-*'], nozzles: ['N25', 'N14'], vision: 'lead-row', tape: [16, 8], polarised: true, pads: { count: 14 }, body: 'JEDEC MS-012 AB, from memory' }),
  pkg('SOIC-16', 'SOIC', [9.9, 3.9, 1.75], { aliases: ['SOIC16', 'SOIC-16-*'], nozzles: ['N25', 'N14'], vision: 'lead-row', tape: [16, 8], polarised: true, pads: { count: 16 }, body: 'JEDEC MS-012 AC, from memory' }),
  pkg('SOIC-16W', 'SOIC', [10.3, 7.5, 2.65], { aliases: ['SOIC16W', 'SOIC-16W-*'], nozzles: ['N25'], vision: 'lead-row', tape: [16, 12], polarised: true, pads: { count: 16 }, body: 'JEDEC MS-013 AA, from memory' }),
  pkg('TSSOP-14', 'SSOP/TSSOP', [5.0, 4.4, 1.2], { aliases: ['TSSOP14', 'TSSOP-14-*'], nozzles: ['N14', 'N10'], vision: 'lead-row', tape: [12, 8], polarised: true, pads: { count: 14 }, body: 'JEDEC MO-153 AB-1, from memory' }),
  pkg('TSSOP-20', 'SSOP/TSSOP', [6.5, 4.4, 1.2], { aliases: ['TSSOP20', 'TSSOP-20-*'], nozzles: ['N14', 'N10'], vision: 'lead-row', tape: [16, 8], polarised: true, pads: { count: 20 }, body: 'JEDEC MO-153 AC, from memory' }),
  pkg('MSOP-8', 'SSOP/TSSOP', [3.0, 3.0, 1.1], { aliases: ['MSOP8', 'MSOP-8-*', 'VSSOP-8*'], nozzles: ['N10'], vision: 'lead-row', tape: [12, 8], polarised: true, pads: { count: 8 }, body: 'JEDEC MO-187, from memory' }),
  pkg('QFN-16-3x3', 'QFN/DFN', [3.0, 3.0, 0.9], { aliases: ['QFN16-3x3', 'QFN-16-3X3-*'], nozzles: ['N14', 'N10'], vision: 'bottom-pads', tape: [12, 8], polarised: true, pads: { count: 17 }, body: 'JEDEC MO-220, from memory' }),
  pkg('QFN-24-4x4', 'QFN/DFN', [4.0, 4.0, 0.9], { aliases: ['QFN24-4x4', 'QFN-24-4X4-*'], nozzles: ['N25', 'N14'], vision: 'bottom-pads', tape: [12, 8], polarised: true, pads: { count: 25 }, body: 'JEDEC MO-220, from memory' }),
  pkg('QFN-32-5x5', 'QFN/DFN', [5.0, 5.0, 0.9], { aliases: ['QFN32-5x5'], nozzles: ['N25', 'N14'], vision: 'bottom-pads', tape: [12, 8], polarised: true, pads: { count: 33 }, body: 'JEDEC MO-220, ' + MEM }),
  pkg('QFN-40-6x6', 'QFN/DFN', [6.0, 6.0, 0.9], { aliases: ['QFN40-6x6', 'QFN-40-6X6-*'], nozzles: ['N25'], vision: 'bottom-pads', tape: [16, 12], polarised: true, pads: { count: 41 }, body: 'JEDEC MO-220, from memory' }),
  pkg('QFN-48-7x7', 'QFN/DFN', [7.0, 7.0, 0.9], { aliases: ['QFN48-7x7', 'QFN-48-7X7-*'], nozzles: ['N25', 'N40'], vision: 'bottom-pads', tape: [16, 12], polarised: true, pads: { count: 49 }, body: 'JEDEC MO-220, from memory' }),
  pkg('DFN-8-3x3', 'QFN/DFN', [3.0, 3.0, 0.8], { aliases: ['DFN8-3x3', 'DFN-8-3X3-*'], nozzles: ['N14', 'N10'], vision: 'bottom-pads', tape: [12, 8], polarised: true, pads: { count: 9 }, body: 'JEDEC MO-229, from memory' }),
  pkg('LGA-8-2.5x2.5', 'QFN/DFN', [2.5, 2.5, 0.9], { aliases: ['LGA8-2.5x2.5'], nozzles: ['N10'], vision: 'bottom-pads', tape: [12, 4], courtyard: 0.1, polarised: true, pads: { count: 8 }, body: MEM, extra: 'Courtyard 0.1 mm (IPC-7351B level C, from memory) as in samples/library.json' }),
  pkg('TQFP-48-7x7', 'QFP', [7.0, 7.0, 1.2], { aliases: ['TQFP48-7x7'], nozzles: ['N40', 'N25'], vision: 'lead-quad', tape: [16, 12], polarised: true, pads: { count: 48 }, body: 'JEDEC MS-026, ' + MEM + '; body without leads (9.0 across the leads)' }),
  pkg('QFP-44-10x10', 'QFP', [10.0, 10.0, 1.6], { aliases: ['QFP44', 'TQFP-44*', 'LQFP-44*'], nozzles: ['N40'], vision: 'lead-quad', tape: [24, 16], polarised: true, pads: { count: 44 }, body: 'JEDEC MS-026, from memory; 0.8 mm lead pitch, 12.0 across the leads' }),
  pkg('QFP-64-10x10', 'QFP', [10.0, 10.0, 1.6], { aliases: ['QFP64', 'LQFP-64*', 'TQFP-64*'], nozzles: ['N40'], vision: 'lead-quad', tape: [24, 16], polarised: true, pads: { count: 64 }, body: 'JEDEC MS-026, from memory; 0.5 mm lead pitch, 12.0 across the leads' }),
  pkg('BGA-100-9x9', 'BGA', [9.0, 9.0, 1.2], { aliases: ['BGA100*', 'FBGA-100*'], nozzles: ['N40', 'N25'], vision: 'ball-grid', feeder: 'tray', polarised: true, pads: { length: 0.4, width: 0.4, count: 100 }, body: 'JEDEC MO-275, from memory; 0.8 mm ball pitch, 10 × 10 balls' }),
  pkg('BGA-256-17x17', 'BGA', [17.0, 17.0, 1.7], { aliases: ['BGA256*', 'FBGA-256*'], nozzles: ['N40'], vision: 'ball-grid', feeder: 'tray', polarised: true, pads: { length: 0.5, width: 0.5, count: 256 }, body: 'JEDEC MO-192, from memory; 1.0 mm ball pitch, 16 × 16 balls' }),
];

const passivesLarge: Pkg[] = [
  pkg('ECAP-4x5.4', 'electrolytic', [4.3, 4.3, 5.4], { aliases: ['ECAP-4X5.4*', 'CP-4x5.4*'], nozzles: ['N25'], vision: 'tall-body', tape: [12, 8], courtyard: 0.5, polarised: true, body: MEM + '; 4 mm can on a 4.3 mm base plate' }),
  pkg('ECAP-5x5.4', 'electrolytic', [5.3, 5.3, 5.4], { aliases: ['ECAP-5X5.4*', 'CP-5x5.4*'], nozzles: ['N25', 'N40'], vision: 'tall-body', tape: [12, 12], courtyard: 0.5, polarised: true, body: MEM + '; 5 mm can on a 5.3 mm base plate' }),
  pkg('ECAP-6.3x5.8', 'electrolytic', [6.6, 6.6, 5.8], { aliases: ['ECAP-6.3*'], nozzles: ['N40'], vision: 'tall-body', tape: [16, 12], courtyard: 0.5, polarised: true, body: MEM + '; 6.3 mm can on a 6.6 mm base plate' }),
  pkg('ECAP-8x10.2', 'electrolytic', [8.3, 8.3, 10.2], { aliases: ['ECAP-8X10*', 'CP-8x10*'], nozzles: ['N40'], vision: 'tall-body', tape: [24, 16], courtyard: 0.5, polarised: true, body: MEM + '; 8 mm can on an 8.3 mm base plate' }),
  pkg('ECAP-10x10.2', 'electrolytic', [10.3, 10.3, 10.2], { aliases: ['ECAP-10X10*', 'CP-10x10*'], nozzles: ['N40'], vision: 'tall-body', tape: [24, 16], courtyard: 0.5, polarised: true, body: MEM + '; 10 mm can on a 10.3 mm base plate' }),
  pkg('XTAL-2520', 'crystal', [2.5, 2.0, 0.6], { aliases: ['XTAL2520*', 'CRYSTAL-2520*'], nozzles: ['N10'], vision: 'chip-medium', tape: [8, 4], pads: { count: 4 }, body: MEM }),
  pkg('XTAL-3225', 'crystal', [3.2, 2.5, 0.8], { aliases: ['XTAL3225*'], nozzles: ['N14'], vision: 'chip-medium', tape: [8, 4], pads: { count: 4 }, body: MEM }),
  pkg('XTAL-5032', 'crystal', [5.0, 3.2, 1.0], { aliases: ['XTAL5032*', 'CRYSTAL-5032*'], nozzles: ['N25', 'N14'], vision: 'chip-medium', tape: [12, 8], pads: { count: 2 }, body: MEM }),
  pkg('XTAL-HC49-SMD', 'crystal', [11.4, 4.7, 4.2], { aliases: ['HC49-SMD*', 'HC-49S-SMD*'], nozzles: ['N40'], vision: 'tall-body', tape: [24, 8], courtyard: 0.5, body: MEM }),
  pkg('IND-3x3', 'other', [3.0, 3.0, 1.5], { aliases: ['IND-3X3*'], nozzles: ['N14', 'N25'], vision: 'tall-body', tape: [12, 8], body: MEM + ' (shielded power inductor)' }),
  pkg('IND-4x4', 'other', [4.0, 4.0, 2.0], { aliases: ['IND-4X4*'], nozzles: ['N25'], vision: 'tall-body', tape: [12, 8], body: MEM + ' (shielded power inductor)' }),
  pkg('SW-TACT-6x6', 'other', [6.0, 6.0, 4.3], { aliases: ['SW-TACT-6X6*'], nozzles: ['N40'], vision: 'tall-body', tape: [16, 12], courtyard: 0.5, body: MEM }),
];

// Connectors with their origin on pin 1: the body centre is offset (shared/README.md, "Findings").
const connectors: Pkg[] = [
  pkg('HDR-1x2-2.54', 'connector', [5.1, 2.5, 8.5], { aliases: ['CONN-2P*'], nozzles: ['N25'], vision: 'tall-body', tape: [16, 8], offset: [1.27, 0], body: MEM + '; origin on pin 1' }),
  pkg('HDR-1x4-2.0', 'connector', [10.0, 4.5, 6.0], { aliases: ['HDR-1X4-2.0*'], nozzles: [], vision: 'tall-body', tape: [16, 8], offset: [3.0, -1.0], body: MEM + '; origin on pin 1, so the body centre is offset', extra: 'No nozzle list on purpose, as samples/library.json: the largest tip that fits is chosen' }),
  pkg('JST-SH-4-SIDE', 'connector', [6.0, 4.25, 2.9], { aliases: ['JST-SH-4*', 'CONN-SH-4*'], nozzles: ['N25'], vision: 'tall-body', tape: [12, 8], offset: [1.5, -1.5], polarised: true, body: MEM + ' (1.0 mm pitch, side entry); origin on pin 1' }),
  pkg('USB-MICRO-B', 'connector', [7.5, 5.0, 2.7], { aliases: ['USB-MICRO*', 'MICRO-USB*'], nozzles: ['N40', 'N25'], vision: 'tall-body', tape: [16, 8], offset: [0, 1.45], polarised: true, body: MEM + '; origin on the pad row, body centre behind it' }),
  pkg('TERM-2P-5.0', 'connector', [10.0, 7.6, 10.0], { aliases: ['TERM-2P-5.0*'], nozzles: ['N40'], vision: 'tall-body', feeder: 'tube', offset: [2.5, 0], courtyard: 0.5, body: MEM + ' (2-way 5.0 mm terminal block); origin on pin 1', extra: "Deliberately not aliased to samples/faulty's TERMBLOCK-5MM, which is planted to match nothing" }),
];

export const STARTER_LIBRARY = {
  format: 'placewright-library/1',
  packages: [...chips, ...discretes, ...ics, ...passivesLarge, ...connectors],
  // Nozzles: the demo's own names and sizes, as samples/library.json.
  nozzles: [
    { name: 'N02', tipOuter: 0.2, tipInner: 0.1, holderRadius: 1.5, notes: "The demo's own (01005 chips)." },
    { name: 'N03', tipOuter: 0.3, tipInner: 0.15, holderRadius: 1.75, notes: "The demo's own (0201 chips)." },
    { name: 'N05', tipOuter: 0.5, tipInner: 0.25, holderRadius: 2.0, notes: "The demo's own (0402 chips)." },
    { name: 'N07', tipOuter: 0.7, tipInner: 0.4, holderRadius: 2.5, notes: "The demo's own (0402–0603 chips, SOT-23)." },
    { name: 'N10', tipOuter: 1.0, tipInner: 0.6, holderRadius: 3.0, notes: "The demo's own." },
    { name: 'N14', tipOuter: 1.4, tipInner: 0.9, holderRadius: 3.5, notes: "The demo's own." },
    { name: 'N25', tipOuter: 2.5, tipInner: 1.6, holderRadius: 4.5, notes: "The demo's own." },
    { name: 'N40', tipOuter: 4.0, tipInner: 2.8, holderRadius: 6.0, notes: "The demo's own (large and tall parts)." },
  ],
  // Vision presets: the demo's own names (as samples/library.json) and values.
  visionPresets: [
    { name: 'chip-small', method: 'body-outline', lighting: 'top', sizeTolerancePct: 20, maxCentringOffset: 0.3, maxAngleCorrection: 10, notes: "The demo's own values." },
    { name: 'chip-medium', method: 'body-outline', lighting: 'top', sizeTolerancePct: 15, maxCentringOffset: 0.5, maxAngleCorrection: 10, notes: "The demo's own values." },
    { name: 'chip-large', method: 'body-outline', lighting: 'both', sizeTolerancePct: 10, maxCentringOffset: 0.8, maxAngleCorrection: 8, notes: "The demo's own values." },
    { name: 'lead-row', method: 'lead-tips', lighting: 'side', sizeTolerancePct: 10, maxCentringOffset: 0.5, maxAngleCorrection: 5, notes: "The demo's own values." },
    { name: 'lead-quad', method: 'lead-tips', lighting: 'side', sizeTolerancePct: 8, maxCentringOffset: 0.6, maxAngleCorrection: 4, notes: "The demo's own values." },
    { name: 'bottom-pads', method: 'corner-edges', lighting: 'both', sizeTolerancePct: 10, maxCentringOffset: 0.5, maxAngleCorrection: 5, notes: "The demo's own values (samples/library.json names its method pad-pattern)." },
    { name: 'ball-grid', method: 'ball-grid', lighting: 'side', sizeTolerancePct: 8, maxCentringOffset: 0.5, maxAngleCorrection: 3, notes: "The demo's own values." },
    { name: 'tall-body', method: 'body-outline', lighting: 'top', sizeTolerancePct: 15, maxCentringOffset: 1.0, maxAngleCorrection: 5, notes: "The demo's own values (samples/library.json names its method silhouette)." },
  ],
  // The demo's two desktop machines: 400 × 400 mm reach (common practice).
  machines: [
    { name: 'HC line A (desktop)', reachX: 400, reachY: 400, nozzles: ['N02', 'N03', 'N05', 'N07', 'N10', 'N14', 'N25', 'N40'], maxPartHeight: 12, notes: "Reach: common practice for desktop machines of this kind. Nozzles and part height: the demo's own (N02 and N03 added for the finest chips)." },
    { name: 'HC line B (desktop)', reachX: 400, reachY: 400, nozzles: ['N05', 'N07', 'N10', 'N14', 'N25'], maxPartHeight: 12, notes: "Reach: common practice for desktop machines of this kind. Nozzles and part height: the demo's own." },
  ],
};
