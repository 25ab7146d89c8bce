/**
 * Names a user gives to values that programs then use as object keys (template parameters, controls, data
 * sets): the ones every JavaScript object already has are refused, because an object keyed by such a name
 * misbehaves silently (`o["__proto__"] = 1.5` changes nothing, `"constructor" in o` is always true).
 */

/** The property names of Object.prototype (ECMAScript 2024, 20.1.3 and B.2.2) plus `prototype`. */
export const RESERVED_NAMES: readonly string[] = Object.freeze([
  "__proto__",
  "__defineGetter__",
  "__defineSetter__",
  "__lookupGetter__",
  "__lookupSetter__",
  "constructor",
  "hasOwnProperty",
  "isPrototypeOf",
  "propertyIsEnumerable",
  "prototype",
  "toLocaleString",
  "toString",
  "valueOf",
]);

const reserved = new Set(RESERVED_NAMES);

/** True when `name` is one of RESERVED_NAMES. */
export function isReservedName(name: string): boolean {
  return reserved.has(name);
}

/** Why a reserved name is refused, for messages: `"__proto__" is reserved: ...`. */
export function reservedNameReason(name: string): string {
  return `${JSON.stringify(name)} is reserved: every JavaScript object has a property of that name; choose another name`;
}
