// Package calc is the calculation core of Setcard: the Hiley dynamic formula
// for piles driven with a drop hammer, solved so that the temporary
// compressions agree with the driving stress that each answer implies.
//
// It imports only the standard library, knows nothing of drawing, files or
// the browser, and never returns NaN or an infinity: bad input is refused
// with a *FieldError naming the field, the value and the allowed range.
//
// # Notation
//
// One notation is used throughout, the British one:
//
//	R_u = e_f · W · h · η / (s + c/2)        c = Cc + Cp + Cq
//
// R_u ultimate driving resistance (kN); W ram weight (kN); h drop (mm);
// e_f hammer efficiency; η efficiency of blow; s permanent set per blow (mm);
// Cc, Cp, Cq the temporary compressions (mm) of the pile head and cap, of the
// pile, and of the ground (quake). c is the whole temporary compression; it
// is halved once, in the formula, and nowhere else. (Venkatramaiah,
// Geotechnical Engineering, Eq. 16.23, writes C already halved.)
//
// Units that cross the package boundary are named in the identifier:
// RamKg, DropM, SetMm, UltimateKN, StressMPa.
//
// # Where the numbers come from
//
// Every table value carries a Source and a Mark: MarkConfirmed (checked in
// the named source), MarkSecondary (quoted by a secondary source),
// MarkMemory (from memory, not confirmed) and MarkPractice (common practice
// in the trade, no single source). Choosing these values is engineering
// judgement; every one can be overridden in the project file.
//
// The formula is an aid to judgement. Capacities must be confirmed as local
// codes require, and a licensed engineer approves the set criterion.
package calc
