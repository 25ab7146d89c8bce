/** Argument checks shared by the well functions; each error names the function, the value and the fix. */

/** Throws a RangeError unless u is a finite number > 0. */
export function checkU(where: string, u: number): void {
  if (!(u > 0) || !Number.isFinite(u)) {
    throw new RangeError(
      `${where}: u = ${u}; u = r²S/(4Tt) must be a finite number > 0 (check r, S, T and that t > 0).`,
    );
  }
}

/** Throws a RangeError unless r/B is a finite number >= 0. */
export function checkRB(where: string, rB: number): void {
  if (!(rB >= 0) || !Number.isFinite(rB)) {
    throw new RangeError(
      `${where}: r/B = ${rB}; the leakage parameter must be a finite number >= 0 (0 means no leakage).`,
    );
  }
}
