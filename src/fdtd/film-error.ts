// How far a conductive film's transmission moves when the pulse engine steps it as a resistive sheet.
// A good-conductor film of thickness d, skin depth δ, between media of impedance η ≫ its own: the exact
// two-port gives T ≈ 2Z_f/(η sinh γd) with γd = (1+j)d/δ, the sheet of conductance σd gives T ≈ 2/(ησd)
// = 2Z_f/(η γd), so the sheet's |T| is too high by |sinh γd / γd| — Schelkunoff's absorption term that
// the sheet leaves out (Schelkunoff's transmission-line model of shielding; Ott, Electromagnetic
// Compatibility Engineering, ch. 6). It is small for d ≪ δ and grows as 8.686·d/δ dB for d ≫ δ.

/** 20·log10 |sinh((1+j)u) / ((1+j)u)| for u = d/δ ≥ 0: the sheet's excess transmission in dB. */
export function sheetExcessTransmission_dB(u: number): number {
  if (!(u > 0)) return 0;
  // |sinh((1+j)u)|² = sinh²u + sin²u; for large u, sinh u ≈ e^u/2 (no overflow).
  const magSinh_dB = u < 20
    ? 10 * Math.log10(Math.sinh(u) ** 2 + Math.sin(u) ** 2)
    : 20 * (u * Math.LOG10E - Math.log10(2));
  return magSinh_dB - 20 * Math.log10(u * Math.SQRT2);
}
