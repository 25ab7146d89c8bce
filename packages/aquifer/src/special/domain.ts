/**
 * Argument checks shared by the special functions. Internal to the special folder.
 */

/**
 * The RangeError thrown when a function defined here only for x >= 0 receives a negative argument.
 * `hint` tells the caller what to check; the message names the function and the value.
 */
export function negativeArgumentError(name: string, x: number, hint: string): RangeError {
  return new RangeError(`${name}(x): x = ${x} is negative; ${name} is defined here for x >= 0. ${hint}`);
}
