// The demo library (Harrow Creek Instruments), written to samples/library.json by generate.ts.
// Body sizes: chips exactly as shared/README.md, "Check values and their sources" (EIA-198 / IEC 60115-8 size codes, from
// memory); SOT-23 (JEDEC TO-236) and SOIC-8 (JEDEC MS-012) as given there; the rest are typical
// maker-datasheet dimensions recalled from memory — each package says so in its `source` field.
// `length` is the body's extent along X in the package's zero orientation, `width` along Y.

const CHIP = 'EIA-198 / IEC 60115-8 size codes, from memory; height typical, from memory';
const MEM = 'typical maker-datasheet dimensions, from memory';

export const library = {
  format: 'placewright-library/1',
  notes: 'Harrow Creek Instruments demo library (invented scenario). Nozzle and vision preset names are our own.',
  packages: [
    { name: 'R0402', aliases: ['RES-0402*', 'R_0402'], body: { length: 1.0, width: 0.5, height: 0.35 }, courtyard: 0.25, nozzles: ['N05', 'N07'], vision: 'chip-small', tape: { width: 8, pitch: 2 }, source: CHIP },
    { name: 'C0402', aliases: ['CAP-0402*', 'C_0402'], body: { length: 1.0, width: 0.5, height: 0.5 }, courtyard: 0.25, nozzles: ['N05', 'N07'], vision: 'chip-small', tape: { width: 8, pitch: 2 }, source: CHIP },
    { name: 'R0603', aliases: ['RES-0603*'], body: { length: 1.6, width: 0.8, height: 0.45 }, courtyard: 0.25, nozzles: ['N07', 'N10'], vision: 'chip-small', tape: { width: 8, pitch: 4 }, source: CHIP },
    { name: 'C0603', aliases: ['CAP-0603*'], body: { length: 1.6, width: 0.8, height: 0.8 }, courtyard: 0.25, nozzles: ['N07', 'N10'], vision: 'chip-small', tape: { width: 8, pitch: 4 }, source: CHIP },
    { name: 'LED0603', aliases: ['LED-0603*'], body: { length: 1.6, width: 0.8, height: 0.6 }, courtyard: 0.25, nozzles: ['N07'], vision: 'chip-small', tape: { width: 8, pitch: 4 }, source: CHIP },
    { name: 'R0805', aliases: ['RES-0805*'], body: { length: 2.0, width: 1.25, height: 0.5 }, courtyard: 0.25, nozzles: ['N10', 'N07'], vision: 'chip-medium', tape: { width: 8, pitch: 4 }, source: CHIP },
    { name: 'C0805', aliases: ['CAP-0805*'], body: { length: 2.0, width: 1.25, height: 1.25 }, courtyard: 0.25, nozzles: ['N10', 'N07'], vision: 'chip-medium', tape: { width: 8, pitch: 4 }, source: CHIP },
    { name: 'C1206', aliases: ['CAP-1206*'], body: { length: 3.2, width: 1.6, height: 1.6 }, courtyard: 0.25, nozzles: ['N14', 'N10'], vision: 'chip-medium', tape: { width: 8, pitch: 4 }, source: CHIP },
    { name: 'C1210', aliases: ['CAP-1210*'], body: { length: 3.2, width: 2.5, height: 2.5 }, courtyard: 0.25, nozzles: ['N14'], vision: 'chip-medium', tape: { width: 8, pitch: 4 }, source: CHIP },
    { name: 'R2512', aliases: ['RES-2512*'], body: { length: 6.3, width: 3.2, height: 0.6 }, courtyard: 0.25, nozzles: ['N25'], vision: 'chip-large', tape: { width: 12, pitch: 4 }, source: CHIP },
    { name: 'SOT-23', aliases: ['SOT23', 'SOT-23-*'], body: { length: 2.9, width: 1.3, height: 1.0 }, courtyard: 0.25, rotationOffset: -90, nozzles: ['N07'], vision: 'lead-row', tape: { width: 8, pitch: 4 }, source: 'JEDEC TO-236, from memory; our CAD library draws it pin 1 at the lower left, hence rotationOffset -90' },
    { name: 'SOIC-8', aliases: ['SOIC8', 'SOIC-8-*'], body: { length: 4.9, width: 3.9, height: 1.75 }, courtyard: 0.25, nozzles: ['N14', 'N10'], vision: 'lead-row', tape: { width: 12, pitch: 8 }, source: 'JEDEC MS-012, from memory: body 4.9 x 3.9, 6.0 across the leads' },
    { name: 'SOD-123', aliases: ['SOD123'], body: { length: 2.7, width: 1.6, height: 1.1 }, courtyard: 0.25, nozzles: ['N10'], vision: 'lead-row', tape: { width: 8, pitch: 4 }, source: MEM },
    { name: 'SMA', aliases: ['DO-214AC'], body: { length: 4.3, width: 2.6, height: 2.3 }, courtyard: 0.25, nozzles: ['N14'], vision: 'chip-large', tape: { width: 12, pitch: 4 }, source: 'JEDEC DO-214AC, ' + MEM },
    { name: 'SOT-223', aliases: ['SOT223'], body: { length: 6.5, width: 3.5, height: 1.7 }, courtyard: 0.25, nozzles: ['N25'], vision: 'lead-row', tape: { width: 12, pitch: 8 }, source: MEM },
    { name: 'QFN-32-5x5', aliases: ['QFN32-5x5'], body: { length: 5.0, width: 5.0, height: 0.9 }, courtyard: 0.25, nozzles: ['N25', 'N14'], vision: 'bottom-pads', tape: { width: 12, pitch: 8 }, source: MEM },
    { name: 'TQFP-48-7x7', aliases: ['TQFP48-7x7'], body: { length: 7.0, width: 7.0, height: 1.2 }, courtyard: 0.25, nozzles: ['N40', 'N25'], vision: 'lead-quad', tape: { width: 16, pitch: 12 }, source: MEM + '; body without leads (9.0 across the leads)' },
    { name: 'LGA-8-2.5x2.5', aliases: ['LGA8-2.5x2.5'], body: { length: 2.5, width: 2.5, height: 0.9 }, courtyard: 0.1, nozzles: ['N10'], vision: 'bottom-pads', tape: { width: 12, pitch: 4 }, source: MEM },
    { name: 'XTAL-3225', aliases: ['XTAL3225*'], body: { length: 3.2, width: 2.5, height: 0.8 }, courtyard: 0.25, nozzles: ['N14'], vision: 'chip-medium', tape: { width: 8, pitch: 4 }, source: MEM },
    { name: 'IND-4x4', aliases: ['IND-4X4*'], body: { length: 4.0, width: 4.0, height: 2.0 }, courtyard: 0.25, nozzles: ['N25'], vision: 'tall-body', tape: { width: 12, pitch: 8 }, source: MEM },
    { name: 'ECAP-6.3x5.8', aliases: ['ECAP-6.3*'], body: { length: 6.6, width: 6.6, height: 5.8 }, courtyard: 0.5, nozzles: ['N40'], vision: 'tall-body', tape: { width: 16, pitch: 12 }, source: MEM + '; 6.3 mm can on a 6.6 mm base plate' },
    { name: 'SW-TACT-6x6', aliases: ['SW-TACT-6X6*'], body: { length: 6.0, width: 6.0, height: 4.3 }, courtyard: 0.5, nozzles: ['N40'], vision: 'tall-body', tape: { width: 16, pitch: 12 }, source: MEM },
    { name: 'HDR-1x4-2.0', aliases: ['HDR-1X4-2.0*'], body: { length: 10.0, width: 4.5, height: 6.0, offsetX: 3.0, offsetY: -1.0 }, courtyard: 0.25, vision: 'tall-body', tape: { width: 16, pitch: 8 }, source: MEM + '; origin on pin 1, so the body centre is offset; no nozzle list (largest tip that fits)' },
    { name: 'HDR-1x2-2.54', aliases: ['CONN-2P*'], body: { length: 5.1, width: 2.5, height: 8.5, offsetX: 1.27, offsetY: 0 }, courtyard: 0.25, nozzles: ['N25'], vision: 'tall-body', tape: { width: 16, pitch: 8 }, source: MEM + '; origin on pin 1' },
  ],
  nozzles: [
    { name: 'N05', tipOuter: 0.5, tipInner: 0.25, holderRadius: 2.0 },
    { name: 'N07', tipOuter: 0.7, tipInner: 0.4, holderRadius: 2.5 },
    { name: 'N10', tipOuter: 1.0, tipInner: 0.6, holderRadius: 3.0 },
    { name: 'N14', tipOuter: 1.4, tipInner: 0.9, holderRadius: 3.5 },
    { name: 'N25', tipOuter: 2.5, tipInner: 1.6, holderRadius: 4.5 },
    { name: 'N40', tipOuter: 4.0, tipInner: 2.8, holderRadius: 6.0 },
  ],
  visionPresets: [
    { name: 'chip-small', method: 'body-outline' },
    { name: 'chip-medium', method: 'body-outline' },
    { name: 'chip-large', method: 'body-outline' },
    { name: 'lead-row', method: 'lead-tips' },
    { name: 'lead-quad', method: 'lead-tips' },
    { name: 'bottom-pads', method: 'corner-edges' },
    { name: 'tall-body', method: 'body-outline' },
  ],
};
