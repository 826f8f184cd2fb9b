/**
 * The printed sources Kerfline's figures are checked against or taken from, as data: the screens show the
 * citation, and the tests that check a figure name the same source by its id.
 */
import type { PrintedSource } from './basis.js';

/**
 * Machinery's Handbook, 31st edition, "Band Saw Blades", p. 1245: the notes to the table "Bimetal Band Saw
 * Speeds for Cutting 4-Inch Material with Coolant". They give the blade pitch for five lengths of cut (1/4 in
 * 10/14, 3/4 in 6/10, 1 1/4 in 4/6, 4 in 3/4, 8 in 2/3) and the band-speed change for each (+15 %, +12 %,
 * +10 %, 0, −12 %), and say to reduce the speed 50 % for carbon steel blades and 30–50 % when cutting dry.
 */
export const MH31_BAND_SAW_NOTES: PrintedSource = {
  id: 'mh31-band-saw-p1245',
  citation:
    "Machinery's Handbook, 31st ed. (Industrial Press, 2020), Band Saw Blades, p. 1245: notes to the table “Bimetal Band Saw Speeds for Cutting 4-Inch Material with Coolant”",
};

/**
 * AISC Steel Construction Manual, 15th edition, Part 1 dimension and property tables (W-shapes Table 1-1,
 * C-shapes Table 1-5, rectangular HSS Table 1-11, square HSS Table 1-12, pipe Table 1-14), as published in the
 * AISC Shapes Database v15.0.
 */
export const AISC_MANUAL_15_SHAPES: PrintedSource = {
  id: 'aisc-manual-15-part-1',
  citation:
    'AISC Steel Construction Manual, 15th ed. (American Institute of Steel Construction, 2017), Part 1 dimension and property tables (AISC Shapes Database v15.0)',
};

/** AISC 360-16, Specification for Structural Steel Buildings, §B4.2: design wall 0.93 × nominal for ERW HSS. */
export const AISC_360_B4_2: PrintedSource = {
  id: 'aisc-360-16-b4-2',
  citation:
    'ANSI/AISC 360-16, Specification for Structural Steel Buildings, §B4.2 (design wall thickness of ERW HSS = 0.93 × nominal)',
};

/** Fine Woodworking, "Setting Bandsaw Blade Tension": blade makers' tension ranges by blade material, psi. */
export const FWW_BAND_TENSION: PrintedSource = {
  id: 'fww-bandsaw-tension',
  citation:
    'Fine Woodworking (The Taunton Press), “Setting Bandsaw Blade Tension”: blade makers recommend 15,000–20,000 psi for carbon-steel blades and 25,000–30,000 psi for bimetal blades',
};

/**
 * Young's modulus of carbon steel: 30 000 ksi = 207 GPa for 0.2–0.8 % C steels in a university strength-of-materials
 * table of material constants, within the 190–210 GPa (28–30 Msi) Gere gives for steels.
 */
export const STEEL_MODULUS_SOURCE: PrintedSource = {
  id: 'steel-modulus',
  citation:
    'Triton College, Strength of Materials course, table of material constants: carbon steels E = 30,000 ksi (207 GPa); J. M. Gere, Mechanics of Materials, 5th ed. (Brooks/Cole), elastic constants: steels 190–210 GPa',
};

/** IEC 60050-192:2015, International Electrotechnical Vocabulary, Part 192: Dependability. */
export const IEC_60050_192: PrintedSource = {
  id: 'iec-60050-192',
  citation: 'IEC 60050-192:2015, International Electrotechnical Vocabulary — Part 192: Dependability',
};

/** ASME B36.10M, Welded and Seamless Wrought Steel Pipe: outside diameters and walls by schedule. */
export const ASME_B36_10M: PrintedSource = {
  id: 'asme-b36-10m',
  citation:
    'ASME B36.10M, Welded and Seamless Wrought Steel Pipe, dimension table (as reprinted in AISC Manual Table 1-14)',
};

/** NIST SP 811 (2008), Appendix B.8: exact conversion factors (inch, foot, pound-force). */
export const NIST_SP_811: PrintedSource = {
  id: 'nist-sp-811',
  citation:
    'NIST Special Publication 811 (2008 ed.), Guide for the Use of the International System of Units, Appendix B.8',
};

/** Shigley's flat belt geometry: open-belt length and the flat metal belt example. */
export const SHIGLEY_FLAT_BELTS: PrintedSource = {
  id: 'shigley-ch17',
  citation:
    "Budynas & Nisbett, Shigley's Mechanical Engineering Design (McGraw-Hill), ch. 17, flat belts: open-belt length and flat metal belt stresses",
};
