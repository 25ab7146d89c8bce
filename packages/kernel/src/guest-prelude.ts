/**
 * The JavaScript that runs first in every sandbox context, as source text. It is a function expression the
 * host calls once with an object of host functions; it installs the cell-facing globals (`aq`, `charts`,
 * `show`, `control`, the seeded `Math.random`, the clock-free `Date`) and returns an object of internals the
 * host keeps a handle to. The host functions themselves are captured in closures here and never put on the
 * global object, so a cell can reach them only through the wrappers below, which send plain data.
 *
 * Intrinsics the prelude relies on (JSON, Object, Float64Array, ...) are captured before any cell runs, so a
 * cell that tampers with prototypes or globals cannot change how values are encoded for the host.
 * The wire format is described in wire.ts; this is its guest half.
 */
export const GUEST_PRELUDE_FILENAME = "conebook:prelude";

export const GUEST_PRELUDE = String.raw`(function (host, config) {
  "use strict";
  const G = globalThis;
  const stringify = JSON.stringify, parse = JSON.parse;
  const getProto = Object.getPrototypeOf, objectProto = Object.prototype, arrayProto = Array.prototype, keysOf = Object.keys;
  const isArray = Array.isArray, isView = ArrayBuffer.isView;
  const freeze = Object.freeze, defineProperty = Object.defineProperty;
  const isFinite = Number.isFinite;
  const F64A = Float64Array, TypeErr = TypeError, Err = Error, Sym = Symbol;
  const sliceBuffer = Function.prototype.call.bind(ArrayBuffer.prototype.slice);
  const bufferLength = Function.prototype.call.bind(Object.getOwnPropertyDescriptor(ArrayBuffer.prototype, "byteLength").get);
  const sliceArray = Function.prototype.call.bind(Array.prototype.slice);
  const push = Function.prototype.call.bind(Array.prototype.push);
  const callFn = Function.prototype.call.bind(Function.prototype.call);
  const hasOwn = Function.prototype.call.bind(Object.prototype.hasOwnProperty);
  const indirectEval = eval, construct = Reflect.construct, reflectApply = Reflect.apply;
  const DISPLAY = Sym("conebook.display");
  // The CSV texts of the data tables a cell has read, by table index: passed back, one crosses as a reference.
  const texts = [], TEXT_MIN = config.textReferenceMin;
  const CYCLE_CHECK_DEPTH = 64;

  function describe(v) {
    if (v === null) return "null";
    if (typeof v === "function") return "a function";
    if (typeof v !== "object") return "a " + typeof v;
    const p = getProto(v);
    const ctor = p && p.constructor && typeof p.constructor.name === "string" ? p.constructor.name : "object";
    return "a " + (ctor || "object");
  }
  function fieldName(where, key) {
    return key === "" ? where : where + ", field " + stringify("" + key);
  }
  // An own data property even for the key "__proto__" (plain assignment would set the prototype instead).
  function setOwn(o, k, v) {
    if (k === "__proto__") defineProperty(o, k, { value: v, writable: true, enumerable: true, configurable: true });
    else o[k] = v;
  }

  // Wire text is [value, patches]: value is plain JSON with a null placeholder for every Float64Array, non-finite
  // number, -0 and undefined, and patches lists path, code pairs saying what each placeholder stands for (see
  // wire.ts). The walk below checks that only plain data is passed and copies it into a tree that the native
  // JSON.stringify writes without a replacer (a replacer costs a guest function call per value). Numbers,
  // strings, booleans and null inside arrays and objects are copied inline, without a call.
  // Arrays of records the host sent in column form (see wire.ts) that no cell has read yet: owner object -> { key:
  // { getter, spec, read } }. Passed back unread, one crosses in the same column form.
  const lazyTables = new WeakMap();
  const lazyGet = Function.prototype.call.bind(WeakMap.prototype.get);
  const lazySet = Function.prototype.call.bind(WeakMap.prototype.set);
  const ownDescriptor = Object.getOwnPropertyDescriptor, nullObject = Object.create;
  function materialize(spec) {
    const n = spec.n, keys = spec.keys, cols = spec.cols, values = [];
    for (let c = 0; c < cols.length; c++) {
      const col = cols[c];
      if (col.f !== undefined) {
        values[c] = col.f;
        continue;
      }
      const out = [], runs = col.runs, strings = col.s;
      let i = 0;
      for (let r = 0; r < runs.length; r += 2) {
        const text = strings[runs[r]];
        for (let k = runs[r + 1]; k > 0; k--) out[i++] = text;
      }
      values[c] = out;
    }
    const records = [];
    for (let i = 0; i < n; i++) {
      const record = {};
      for (let c = 0; c < keys.length; c++) setOwn(record, keys[c], values[c][i]);
      records[i] = record;
    }
    return records;
  }
  // Arrays made from record tables, with the records they were made of: passed back while every record is still
  // the one made, with the same keys and values (a spread { ...series } reads excluded and copies this array's
  // reference), such an array crosses in column form again.
  const madeFrom = new WeakMap();
  const madeGet = Function.prototype.call.bind(WeakMap.prototype.get);
  const madeSet = Function.prototype.call.bind(WeakMap.prototype.set);
  function sameNumber(a, b) {
    return a === b ? a !== 0 || 1 / a === 1 / b : a !== a && b !== b;
  }
  function unchangedTable(array, made) {
    const spec = made.spec, n = spec.n, keys = spec.keys, cols = spec.cols, records = made.records;
    if (getProto(array) !== arrayProto || array.length !== n) return false;
    const values = [];
    for (let c = 0; c < cols.length; c++) values[c] = cols[c].f !== undefined ? cols[c].f : undefined;
    for (let i = 0; i < n; i++) {
      const r = array[i];
      if (r !== records[i] || getProto(r) !== objectProto) return false;
      let count = 0;
      for (const k in r) count++;
      if (count !== keys.length) return false;
      for (let c = 0; c < keys.length; c++) {
        const v = r[keys[c]];
        if (values[c] !== undefined ? typeof v !== "number" || !sameNumber(v, values[c][i]) : typeof v !== "string") return false;
      }
    }
    // Text columns: compare run by run.
    for (let c = 0; c < cols.length; c++) {
      if (cols[c].f !== undefined) continue;
      const runs = cols[c].runs, strings = cols[c].s, key = keys[c];
      let i = 0;
      for (let k = 0; k < runs.length; k += 2) {
        const text = strings[runs[k]];
        for (let m = runs[k + 1]; m > 0; m--) if (array[i++][key] !== text) return false;
      }
    }
    return true;
  }
  function materializeKept(spec) {
    const records = materialize(spec);
    const copy = [];
    for (let i = 0; i < records.length; i++) copy[i] = records[i];
    madeSet(madeFrom, records, { spec: spec, records: copy });
    return records;
  }
  function lazyRecords(owner, key, spec) {
    const entry = { getter: undefined, spec: spec, read: false };
    let records;
    entry.getter = { [key]() {
      if (!entry.read) {
        entry.read = true;
        records = materializeKept(spec);
        if (ownDescriptor(owner, key).configurable) defineProperty(owner, key, { value: records, writable: true, enumerable: true, configurable: true });
      }
      return records;
    } }[key];
    const setter = { [key](v) {
      entry.read = true;
      defineProperty(owner, key, { value: v, writable: true, enumerable: true, configurable: true });
    } }[key];
    defineProperty(owner, key, { get: entry.getter, set: setter, enumerable: true, configurable: true });
    let table = lazyGet(lazyTables, owner);
    if (table === undefined) {
      table = nullObject(null);
      lazySet(lazyTables, owner, table);
    }
    table[key] = entry;
  }
  // The entry of owner[key] when it is still an unread record table, else undefined.
  function unreadTable(owner, key) {
    const table = lazyGet(lazyTables, owner);
    if (table === undefined) return undefined;
    const entry = table[key];
    if (entry === undefined || entry.read) return undefined;
    const d = ownDescriptor(owner, key);
    return d !== undefined && d.get === entry.getter ? entry : undefined;
  }

  function encode(value, where) {
    // JSON.stringify calls an inherited toJSON on every object and array of the wire text itself.
    for (let i = 0; i < 2; i++) {
      if (hasOwn(i === 0 ? objectProto : arrayProto, "toJSON")) {
        throw new TypeErr(where + " cannot be passed while " + (i === 0 ? "Object" : "Array") + ".prototype has a toJSON method, which would replace every value sent to the host; delete " + (i === 0 ? "Object" : "Array") + ".prototype.toJSON");
      }
    }
    const buffers = [], patches = [], path = [], containers = [], tables = [];
    function recordTable(spec, depth) {
      const columns = [];
      for (let c = 0; c < spec.cols.length; c++) {
        const col = spec.cols[c];
        const bytes = col.f !== undefined ? col.f : col.runs;
        buffers[buffers.length] = sliceBuffer(bytes.buffer, bytes.byteOffset, bytes.byteOffset + bytes.byteLength);
        columns[c] = col.f !== undefined ? { f: buffers.length - 1 } : { s: col.s, runs: buffers.length - 1 };
      }
      tables[tables.length] = { n: spec.n, keys: spec.keys, columns: columns };
      return patch(depth, { r: tables.length - 1 });
    }
    function patch(depth, code) {
      const p = [];
      for (let j = 0; j < depth; j++) p[j] = path[j];
      patches[patches.length] = p;
      patches[patches.length] = code;
      return null;
    }
    // v sits at path[0 .. depth - 1]; key is its key in its container ("" for the value itself).
    function walk(v, key, depth) {
      let type = typeof v;
      if ((type === "object" && v !== null) || type === "bigint") {
        const toJSON = v.toJSON;
        if (typeof toJSON === "function") {
          v = callFn(toJSON, v, "" + key);
          type = typeof v;
        }
      }
      if (type === "number") {
        if (v - v === 0 && (v !== 0 || 1 / v > 0)) return v;
        return patch(depth, v !== v ? "NaN" : v === 0 ? "-0" : v > 0 ? "Infinity" : "-Infinity");
      }
      if (type === "string") {
        if (v.length >= TEXT_MIN) for (let i = 0; i < texts.length; i++) if (texts[i] === v) return patch(depth, "text:" + i);
        return v;
      }
      if (type === "boolean" || v === null) return v;
      if (type === "undefined") return patch(depth, "undefined");
      if (type !== "object") {
        throw new TypeErr(fieldName(where, key) + " is " + describe(v) + "; only numbers, strings, booleans, null, arrays, plain objects and Float64Array can be passed");
      }
      const array = isArray(v);
      if (!array) {
        if (isView(v)) {
          if (!(v instanceof F64A)) throw new TypeErr(fieldName(where, key) + " is " + describe(v) + "; use a Float64Array or a plain array of numbers");
          // The host copies the bytes before any guest code runs again, so a buffer the array spans whole is sent
          // as it is; a view into part of a buffer sends a copy of its part only.
          // (bufferLength, the intrinsic getter, throws unless whole is an ArrayBuffer, whatever a cell did to
          // the prototypes.)
          const whole = v.buffer, offset = v.byteOffset, length = v.byteLength;
          buffers[buffers.length] = offset === 0 && length === bufferLength(whole) ? whole : sliceBuffer(whole, offset, offset + length);
          return patch(depth, buffers.length - 1);
        }
        const p = getProto(v);
        if (p !== objectProto && p !== null) {
          throw new TypeErr(fieldName(where, key) + " is " + describe(v) + "; only plain objects (written as { ... }) can be passed");
        }
      }
      // A cycle always grows the path past CYCLE_CHECK_DEPTH, so shallow data (the usual case) is never scanned.
      if (depth >= CYCLE_CHECK_DEPTH) {
        for (let j = 0; j < depth; j++) {
          if (containers[j] === v) throw new TypeErr(fieldName(where, key) + " contains itself; pass data without cycles");
        }
      }
      containers[depth] = v;
      let out;
      if (array) {
        const made = madeGet(madeFrom, v);
        if (made !== undefined && unchangedTable(v, made)) return recordTable(made.spec, depth);
        out = [];
        const n = v.length;
        for (let i = 0; i < n; i++) {
          const e = v[i], t = typeof e;
          if (t === "number" ? e - e === 0 && (e !== 0 || 1 / e > 0) : t === "string" ? e.length < TEXT_MIN : t === "boolean" || e === null) out[i] = e;
          else {
            path[depth] = i;
            out[i] = walk(e, i, depth + 1);
          }
        }
      } else {
        out = {};
        const ks = keysOf(v);
        const lazy = lazyGet(lazyTables, v) !== undefined;
        for (let i = 0; i < ks.length; i++) {
          const k = ks[i];
          if (k === "__proto__") throw new TypeErr(fieldName(where, k) + " is a key named \"__proto__\", which cannot be passed; rename it");
          const unread = lazy ? unreadTable(v, k) : undefined;
          if (unread !== undefined) {
            path[depth] = k;
            out[k] = recordTable(unread.spec, depth + 1);
            continue;
          }
          const e = v[k], t = typeof e;
          let w = e;
          if (!(t === "number" ? e - e === 0 && (e !== 0 || 1 / e > 0) : t === "string" ? e.length < TEXT_MIN : t === "boolean" || e === null)) {
            path[depth] = k;
            w = walk(e, k, depth + 1);
          }
          out[k] = w;
        }
      }
      return out;
    }
    const plain = walk(value, "", 0);
    return [stringify(tables.length > 0 ? [plain, patches, tables] : [plain, patches]), buffers];
  }

  // wire is the host's text alone (no buffers) or [text, buffer0, buffer1, ...].
  function decode(wire) {
    const text = typeof wire === "string";
    const both = parse(text ? wire : wire[0]);
    const patches = both[1];
    if (patches.length === 0) return both[0];
    const buffers = text ? [] : sliceArray(wire, 1), tables = both[2];
    let root = both[0];
    for (let i = 0; i < patches.length; i += 2) {
      const path = patches[i], code = patches[i + 1];
      let spec;
      if (typeof code === "object") {
        const t = tables[code.r], cols = [];
        for (let c = 0; c < t.columns.length; c++) {
          const col = t.columns[c];
          cols[c] = col.f !== undefined ? { f: new F64A(buffers[col.f]) } : { s: col.s, runs: new F64A(buffers[col.runs]) };
        }
        spec = { n: t.n, keys: t.keys, cols: cols };
      }
      if (path.length === 0) {
        root = spec !== undefined ? materialize(spec) : typeof code === "number" ? new F64A(buffers[code]) : code === "undefined" ? undefined : +code;
        continue;
      }
      let node = root;
      for (let k = 0; k < path.length - 1; k++) node = node[path[k]];
      const key = path[path.length - 1];
      if (spec !== undefined) {
        if (isArray(node)) setOwn(node, key, materialize(spec));
        else lazyRecords(node, key, spec);
        continue;
      }
      setOwn(node, key, typeof code === "number" ? new F64A(buffers[code]) : code === "undefined" ? undefined : +code);
    }
    return root;
  }

  // Calls host function fn with the leading arguments in head (a name, or nothing) then the wire text and each of
  // its buffers as an argument of its own: the host takes the arguments as they come, with no property reads.
  function sendWire(fn, head, wire) {
    const b = wire[1], n = b.length;
    if (head === undefined) {
      if (n === 0) return fn(wire[0]);
      if (n === 1) return fn(wire[0], b[0]);
    } else {
      if (n === 0) return fn(head, wire[0]);
      if (n === 1) return fn(head, wire[0], b[0]);
    }
    const args = head === undefined ? [wire[0]] : [head, wire[0]];
    const k = args.length;
    for (let i = 0; i < n; i++) args[k + i] = b[i];
    return reflectApply(fn, undefined, args);
  }

  // The bridge: one guest function per allow-listed host function, sending its arguments as wire data.
  function bridgeFunction(guestName, hostFn) {
    const where = guestName + ": argument list";
    const f = function () {
      const args = [];
      for (let i = 0; i < arguments.length; i++) args[i] = arguments[i];
      const wire = encode(args, where);
      return decode(sendWire(hostFn, guestName, wire));
    };
    defineProperty(f, "name", { value: guestName.slice(guestName.lastIndexOf(".") + 1) });
    return freeze(f);
  }

  function namespace(entries) {
    const ns = {};
    for (let i = 0; i < entries.length; i++) {
      const path = entries[i].split(".");
      let node = ns;
      for (let k = 1; k < path.length - 1; k++) node = node[path[k]] || (node[path[k]] = {});
      node[path[path.length - 1]] = bridgeFunction(entries[i], host.call);
    }
    return deepFreeze(ns);
  }
  function deepFreeze(o) {
    const ks = keysOf(o);
    for (let i = 0; i < ks.length; i++) if (typeof o[ks[i]] === "object") deepFreeze(o[ks[i]]);
    return freeze(o);
  }

  const aq = namespace(config.aquifer);
  const charts = namespace(config.charts);
  // Chart builders return a Vega-Lite spec as a chart display, shown where it is made (see display below).
  const chartKeys = keysOf(charts);
  const taggedCharts = {};
  for (let i = 0; i < chartKeys.length; i++) {
    const build = charts[chartKeys[i]];
    taggedCharts[chartKeys[i]] = freeze(defineProperty(function () {
      const spec = build.apply(undefined, arguments);
      return display("chart", { spec: spec });
    }, "name", { value: chartKeys[i] }));
  }

  // Display helpers: tagged frozen records the host turns into outputs. The rule: every display appears, once,
  // in call order: a show.* or charts.* call shows what it makes at once; show(x) shows x unless x is a display
  // this cell has already shown; the cell's last expression is shown on the same terms.
  const shownIn = new WeakMap();
  const shownGet = Function.prototype.call.bind(WeakMap.prototype.get);
  const shownSet = Function.prototype.call.bind(WeakMap.prototype.set);
  let cellNumber = 0;
  function display(kind, payload) {
    const d = { kind: kind, payload: payload };
    defineProperty(d, DISPLAY, { value: true });
    freeze(d);
    emit(d, "show." + kind);
    return d;
  }
  function isDisplay(v) {
    return v !== null && typeof v === "object" && v[DISPLAY] === true;
  }
  function toDisplay(v) {
    if (isDisplay(v)) return { kind: v.kind, payload: v.payload };
    return { kind: "auto", payload: v };
  }
  function emit(v, where) {
    if (isDisplay(v)) {
      if (shownGet(shownIn, v) === cellNumber) return;
      shownSet(shownIn, v, cellNumber);
    }
    const w = encode(toDisplay(v), where);
    sendWire(host.emit, undefined, w);
  }
  function show(v) {
    if (arguments.length === 0) throw new TypeErr("show: give the value to show, e.g. show(T)");
    emit(v, "show: argument 1");
  }
  show.value = function value(number, unit, label) {
    return display("value", { value: number, unit: unit, label: label });
  };
  show.table = function table(data, options) {
    return display("table", { data: data, options: options });
  };
  show.fit = function fit(result, options) {
    return display("fit", { result: result, options: options });
  };
  show.series = function series(s, options) {
    return display("series", { series: s, options: options });
  };
  show.readings = function readings(s, options) {
    return display("readings", { series: s, options: options });
  };
  show.chart = function chart(spec) {
    return display("chart", { spec: spec });
  };
  show.json = function json(v) {
    return display("json", { value: v });
  };
  show.stepTest = function stepTest(result, options) {
    return display("stepTest", { result: result, options: options });
  };
  show.slugTest = function slugTest(result, options) {
    return display("slugTest", { result: result, options: options });
  };
  show.recovery = function recovery(result, options) {
    return display("recovery", { result: result, options: options });
  };
  show.forecast = function forecast(result, options) {
    return display("forecast", { result: result, options: options });
  };
  show.comparison = function comparison(result, options) {
    return display("comparison", { result: result, options: options });
  };
  show.slugChecks = function slugChecks(result, options) {
    return display("slugChecks", { result: result, options: options });
  };
  show.specificCapacity = function specificCapacity(result, options) {
    return display("specificCapacity", { result: result, options: options });
  };
  show.anisotropy = function anisotropy(result, options) {
    return display("anisotropy", { result: result, options: options });
  };
  show.slopeHints = function slopeHints(result, options) {
    return display("slopeHints", { result: result, options: options });
  };
  show.matchPoint = function matchPoint(result, options) {
    return display("matchPoint", { result: result, options: options });
  };
  show.barometricResponse = function barometricResponse(result, options) {
    return display("barometricResponse", { result: result, options: options });
  };
  show.earthTide = function earthTide(result, options) {
    return display("earthTide", { result: result, options: options });
  };
  freeze(show);

  function control(name, options) {
    const w = encode([name, options], "control: argument list");
    return decode(sendWire(host.control, undefined, w));
  }
  freeze(control);

  // Math.random: xoshiro128** (Blackman & Vigna 2018), state filled by splitmix32 from the document seed.
  const imul = Math.imul;
  let seed = config.seed >>> 0;
  function splitmix32() {
    seed = (seed + 0x9e3779b9) | 0;
    let z = seed;
    z = imul(z ^ (z >>> 16), 0x85ebca6b);
    z = imul(z ^ (z >>> 13), 0xc2b2ae35);
    return (z ^ (z >>> 16)) >>> 0;
  }
  let s0 = splitmix32(), s1 = splitmix32(), s2 = splitmix32(), s3 = splitmix32();
  function rotl(x, k) { return (x << k) | (x >>> (32 - k)); }
  function random() {
    const result = imul(rotl(imul(s1, 5), 7), 9) >>> 0;
    const t = s1 << 9;
    s2 ^= s0; s3 ^= s1; s1 ^= s2; s0 ^= s3; s2 ^= t; s3 = rotl(s3, 11);
    return result / 4294967296;
  }
  defineProperty(Math, "random", { value: random, writable: false, configurable: false });

  // Date without a clock and without a time zone: reading the current time is refused, and every "local"
  // method is its UTC twin, so outputs never depend on when or where the document runs.
  const D = Date;
  const utc = D.UTC, dateParse = D.parse;
  const ISO = /^[+-]?\d{4,6}(-\d\d(-\d\d)?)?(T\d\d:\d\d(:\d\d(\.\d{1,9})?)?(Z|[+-]\d\d:\d\d)?)?$/;
  function clockError(what) {
    return new Err(what + " reads the clock, which a Conebook cell may not do: outputs must be the same on every run. " +
      "Give the date explicitly, e.g. new Date(\"2024-05-01T08:00:00Z\").");
  }
  function parseIso(s) {
    if (!ISO.test(s)) {
      throw new Err("Date: " + stringify(s) + " is not an ISO 8601 date; write e.g. \"2024-05-01\" or \"2024-05-01T08:00:00Z\" (times without an offset are UTC)");
    }
    const zoned = s.indexOf("T") < 0 || /(Z|[+-]\d\d:\d\d)$/.test(s) ? s : s + "Z";
    return dateParse(zoned);
  }
  function toTime(args) {
    if (args.length === 1) {
      const a = args[0];
      if (typeof a === "string") return parseIso(a);
      if (a instanceof D) return a.getTime();
      return +a;
    }
    const f = [];
    for (let i = 0; i < 7; i++) push(f, i < args.length ? +args[i] : i === 2 ? 1 : 0);
    return utc(f[0], f[1], f[2], f[3], f[4], f[5], f[6]);
  }
  function SandboxDate() {
    if (!new.target) throw clockError("Date()");
    if (arguments.length === 0) throw clockError("new Date()");
    return construct(D, [toTime(arguments)], new.target);
  }
  SandboxDate.prototype = D.prototype;
  defineProperty(D.prototype, "constructor", { value: SandboxDate, writable: true, configurable: true });
  SandboxDate.UTC = utc;
  SandboxDate.parse = function parse(s) { return parseIso("" + s); };
  SandboxDate.now = function now() { throw clockError("Date.now()"); };
  const P = D.prototype;
  const localToUtc = ["FullYear", "Month", "Date", "Day", "Hours", "Minutes", "Seconds", "Milliseconds"];
  for (let i = 0; i < localToUtc.length; i++) {
    const n = localToUtc[i];
    defineProperty(P, "get" + n, { value: P["getUTC" + n], writable: true, configurable: true });
    if (n !== "Day") defineProperty(P, "set" + n, { value: P["setUTC" + n], writable: true, configurable: true });
  }
  const toIso = P.toISOString;
  defineProperty(P, "getTimezoneOffset", { value: function getTimezoneOffset() { return 0; }, writable: true, configurable: true });
  const asIso = function () { return isFinite(this.getTime()) ? toIso.call(this) : "Invalid Date"; };
  const textMethods = ["toString", "toLocaleString", "toLocaleDateString", "toLocaleTimeString", "toDateString", "toTimeString"];
  for (let i = 0; i < textMethods.length; i++) {
    defineProperty(P, textMethods[i], { value: asIso, writable: true, configurable: true });
  }
  freeze(SandboxDate);
  defineProperty(G, "Date", { value: SandboxDate, writable: false, configurable: false });

  // QuickJS lets Object.defineProperty, Object.defineProperties and Reflect.defineProperty change a
  // non-configurable property of the global object (elsewhere it refuses, as the language requires), which would
  // let a cell replace aq, show, control or a data table. These wrappers refuse such a change on the global
  // object as the language does on any other object; every other call goes to the original unchanged.
  function lockGlobalDefinitions() {
    const getOwnDescriptor = Object.getOwnPropertyDescriptor, create = Object.create, ownKeys = Reflect.ownKeys;
    const nativeDefine = Object.defineProperty, nativeDefineAll = Object.defineProperties, reflectDefine = Reflect.defineProperty;
    const Str = String, isEnumerable = Function.prototype.call.bind(Object.prototype.propertyIsEnumerable);
    const FIELDS = ["enumerable", "configurable", "value", "writable", "get", "set"];
    // The descriptor read once (as ToPropertyDescriptor reads it) into an object without a prototype.
    function descriptorOf(d) {
      if (d === null || (typeof d !== "object" && typeof d !== "function")) throw new TypeErr("Property description must be an object");
      const c = create(null);
      for (let i = 0; i < FIELDS.length; i++) if (FIELDS[i] in d) c[FIELDS[i]] = d[FIELDS[i]];
      return c;
    }
    const same = (a, b) => a === b ? a !== 0 || 1 / a === 1 / b : a !== a && b !== b;
    // True when defining d on key of the global object would change a non-configurable property.
    function changesLocked(key, d) {
      const cur = getOwnDescriptor(G, key);
      if (!cur || cur.configurable) return false;
      if (d.configurable === true || ("enumerable" in d && !d.enumerable !== !cur.enumerable)) return true;
      const accessor = "get" in d || "set" in d;
      if ("value" in cur) {
        if (accessor) return true;
        if (cur.writable) return false;
        return d.writable === true || ("value" in d && !same(d.value, cur.value));
      }
      if ("value" in d || "writable" in d) return true;
      return ("get" in d && d.get !== cur.get) || ("set" in d && d.set !== cur.set);
    }
    const keyOf = (k) => (typeof k === "symbol" ? k : Str(k));
    const refusal = (key) => new TypeErr("cannot redefine property: " + Str(key) + " (the sandbox installs it and keeps it as installed)");
    const methods = {
      defineProperty(o, key, d) {
        if (o !== G) return nativeDefine(o, key, d);
        const k = keyOf(key), c = descriptorOf(d);
        if (changesLocked(k, c)) throw refusal(k);
        return nativeDefine(o, k, c);
      },
      defineProperties(o, props) {
        if (o !== G) return nativeDefineAll(o, props);
        const keys = ownKeys(props), all = create(null);
        for (let i = 0; i < keys.length; i++) {
          if (!isEnumerable(props, keys[i])) continue;
          const c = descriptorOf(props[keys[i]]);
          if (changesLocked(keys[i], c)) throw refusal(keys[i]);
          all[keys[i]] = c;
        }
        return nativeDefineAll(o, all);
      },
      reflectDefine(o, key, d) {
        if (o !== G) return reflectDefine(o, key, d);
        const k = keyOf(key), c = descriptorOf(d);
        return changesLocked(k, c) ? false : reflectDefine(o, k, c);
      },
    };
    defineProperty(methods.reflectDefine, "name", { value: "defineProperty" });
    const method = { writable: true, enumerable: false, configurable: true };
    nativeDefine(Object, "defineProperty", { value: methods.defineProperty, ...method });
    nativeDefine(Object, "defineProperties", { value: methods.defineProperties, ...method });
    nativeDefine(Reflect, "defineProperty", { value: methods.reflectDefine, ...method });
  }

  // Work inside one native builtin is never interrupted, and the engine checks its interrupt only every 10,000
  // interpreter steps, so a builtin called on a huge length, or a loop of builtins that each take milliseconds,
  // would outlive the time limit by far. The builtins that work through a length are wrapped here: each call
  // estimates its work in units of about one element (some 25 ns) and is refused at once when that exceeds
  // config.maxElements (a generic object or a sparse array can claim a length of 2^53 - 1 at no memory cost);
  // otherwise it charges the work, every config.workCheck units the host says whether the cell is overdue, and an
  // overdue cell spins until the interrupt stops it (the host's handler then keeps returning true, so nothing can
  // catch it). A Proxy's ownKeys trap may list at most config.maxProxyKeys keys, since the engine checks their
  // uniqueness in quadratic time.
  function meterBuiltins() {
    const apply = Reflect.apply, construct = Reflect.construct, getOwnDescriptor = Object.getOwnPropertyDescriptor;
    const RangeErr = RangeError, floor = Math.floor, log2 = Math.log2, nativeOwnKeys = Reflect.ownKeys;
    const overdue = host.overdue;
    const MAX = config.maxElements, CHECK = config.workCheck, MAX_KEYS = config.maxProxyKeys;
    let work = 0;
    function charge(units) {
      work += units;
      if (work < CHECK) return;
      work = 0;
      if (overdue()) for (;;) {}
    }
    function lengthOf(o) {
      if (o === null || o === undefined) return 0;
      const n = +o.length;
      return n > 0 ? (n < 9007199254740991 ? floor(n) : 9007199254740991) : 0;
    }
    const nLogN = (n) => (n > 1 ? n * log2(n) : n);
    const method = { writable: true, enumerable: false, configurable: true };
    // Replaces owner[name] by a method that refuses (tooMuch returns the error) or charges its units and calls it.
    function wrap(owner, name, units, tooMuch) {
      const native = owner[name];
      if (typeof native !== "function") return;
      const f = { [name]() {
        const u = units(this, arguments);
        if (u > MAX) throw tooMuch(this, arguments, u);
        charge(u);
        return apply(native, this, arguments);
      } }[name];
      defineProperty(f, "length", { value: native.length });
      defineProperty(owner, name, { value: f, ...method });
    }
    const tooMuch = (what, name, advice) => (o, a, u) => new RangeErr(what + "." + name + ": this call would do about " + floor(u) + " units of work (a unit is about one element), more than the " + MAX + " one call may do in a cell; " + advice);

    // Array methods: one unit per element of this; a sort without a comparator compares as strings, 4 n log2 n.
    const AP = Array.prototype;
    const longArray = (name) => (o) => new RangeErr("Array.prototype." + name + ": this has length " + lengthOf(o) + ", more than the " + MAX + " elements one call may go through in a cell; work on a shorter array");
    const arrayWork = ["copyWithin", "every", "fill", "filter", "find", "findIndex", "findLast", "findLastIndex", "flat",
      "flatMap", "forEach", "includes", "indexOf", "join", "lastIndexOf", "map", "reduce", "reduceRight", "reverse",
      "shift", "slice", "some", "splice", "toLocaleString", "toReversed", "toSpliced", "unshift", "with"];
    for (let i = 0; i < arrayWork.length; i++) wrap(AP, arrayWork[i], lengthOf, longArray(arrayWork[i]));
    const sortUnits = (o, a) => (typeof a[0] === "function" ? lengthOf(o) : 4 * nLogN(lengthOf(o)));
    const longSort = (name) => (o, a) => (typeof a[0] === "function" ? longArray(name)(o) :
      new RangeErr("Array.prototype." + name + ": sorting " + lengthOf(o) + " elements as strings (no comparator given) is more work than one call may do in a cell; give a comparator such as (a, b) => a - b"));
    wrap(AP, "sort", sortUnits, longSort("sort"));
    wrap(AP, "toSorted", sortUnits, longSort("toSorted"));
    const concatUnits = (o, a) => {
      let n = lengthOf(o);
      for (let i = 0; i < a.length; i++) if (isArray(a[i])) n += lengthOf(a[i]);
      return n;
    };
    wrap(AP, "concat", concatUnits, (o, a, u) => new RangeErr("Array.prototype.concat: the arrays have together a length of " + u + ", more than the " + MAX + " elements one call may go through in a cell; work on shorter arrays"));

    // Typed-array methods: one unit per element, n log2 n for a sort without a comparator, 10 per element to
    // write numbers as text.
    const TAP = getProto(Int8Array.prototype);
    const taLength = getOwnDescriptor(TAP, "length").get;
    const typedLength = (o) => {
      try {
        return callFn(taLength, o);
      } catch (e) {
        return 0;
      }
    };
    const typedTooMuch = (name) => tooMuch("TypedArray.prototype", name, "work on a shorter typed array");
    const typedWork = ["copyWithin", "every", "fill", "filter", "find", "findIndex", "findLast", "findLastIndex", "forEach",
      "includes", "indexOf", "lastIndexOf", "map", "reduce", "reduceRight", "reverse", "slice", "some", "toReversed", "with"];
    for (let i = 0; i < typedWork.length; i++) wrap(TAP, typedWork[i], typedLength, typedTooMuch(typedWork[i]));
    const typedSortUnits = (o, a) => (typeof a[0] === "function" ? typedLength(o) : nLogN(typedLength(o)));
    wrap(TAP, "sort", typedSortUnits, typedTooMuch("sort"));
    wrap(TAP, "toSorted", typedSortUnits, typedTooMuch("toSorted"));
    wrap(TAP, "join", (o) => 10 * typedLength(o), typedTooMuch("join"));
    wrap(TAP, "toLocaleString", (o) => 10 * typedLength(o), typedTooMuch("toLocaleString"));
    wrap(TAP, "set", (o, a) => lengthOf(a[0]), typedTooMuch("set"));

    // String methods: one unit per 8 characters of this (the result's length for repeat and the pads).
    const SP = String.prototype;
    const stringTooMuch = (name) => tooMuch("String.prototype", name, "work on a shorter string");
    const chars = (o) => lengthOf(o) / 8;
    const stringWork = ["concat", "endsWith", "includes", "indexOf", "isWellFormed", "lastIndexOf", "localeCompare", "match",
      "matchAll", "normalize", "replace", "replaceAll", "search", "slice", "split", "startsWith", "substr", "substring",
      "toLocaleLowerCase", "toLocaleUpperCase", "toLowerCase", "toUpperCase", "toWellFormed", "trim", "trimEnd", "trimStart"];
    for (let i = 0; i < stringWork.length; i++) wrap(SP, stringWork[i], chars, stringTooMuch(stringWork[i]));
    wrap(SP, "repeat", (o, a) => (lengthOf(o) * (+a[0] > 0 ? +a[0] : 0)) / 8, stringTooMuch("repeat"));
    wrap(SP, "padStart", (o, a) => (+a[0] > 0 ? +a[0] : 0) / 8, stringTooMuch("padStart"));
    wrap(SP, "padEnd", (o, a) => (+a[0] > 0 ? +a[0] : 0) / 8, stringTooMuch("padEnd"));
    wrap(JSON, "parse", (o, a) => (typeof a[0] === "string" ? a[0].length / 8 : 0), tooMuch("JSON", "parse", "parse less text at once"));

    // Whole-object walks: the size of what they produce, charged once they return (what they walk is in memory).
    function after(owner, name, units) {
      const native = owner[name];
      const f = { [name]() {
        const r = apply(native, this, arguments);
        charge(units(r));
        return r;
      } }[name];
      defineProperty(f, "length", { value: native.length });
      defineProperty(owner, name, { value: f, ...method });
    }
    const keyWalks = ["keys", "values", "entries", "getOwnPropertyNames", "getOwnPropertySymbols"];
    for (let i = 0; i < keyWalks.length; i++) after(Object, keyWalks[i], lengthOf);
    after(Reflect, "ownKeys", lengthOf);
    after(JSON, "stringify", (r) => (typeof r === "string" ? r.length / 8 : 0));

    // Proxy: the same constructor, with every handler's ownKeys result counted before the engine sees it.
    const NativeProxy = Proxy, revocable = Proxy.revocable;
    function guardedHandler(handler) {
      if (handler === null || (typeof handler !== "object" && typeof handler !== "function")) return handler;
      const guarded = Object.create(handler);
      defineProperty(guarded, "ownKeys", {
        value: function ownKeys(target) {
          const trap = handler.ownKeys;
          if (trap === undefined || trap === null) return nativeOwnKeys(target);
          const keys = callFn(trap, handler, target);
          const n = keys !== null && typeof keys === "object" ? lengthOf(keys) : 0;
          if (n > MAX_KEYS) throw new RangeErr("a Proxy's ownKeys trap returned " + n + " keys; a cell may list at most " + MAX_KEYS);
          charge((n * n) / 100);
          return keys;
        },
      });
      return guarded;
    }
    // Bound, so that like the original it can be constructed but has no prototype property.
    const SandboxProxy = callFn(Function.prototype.bind, function Proxy(target, handler) {
      if (!new.target) throw new TypeErr("Constructor Proxy requires 'new'");
      return construct(NativeProxy, [target, guardedHandler(handler)]);
    }, undefined);
    defineProperty(SandboxProxy, "name", { value: "Proxy" });
    defineProperty(SandboxProxy, "length", { value: 2 });
    defineProperty(SandboxProxy, "revocable", {
      value: { revocable(target, handler) { return revocable(target, guardedHandler(handler)); } }.revocable,
      ...method,
    });
    defineProperty(G, "Proxy", { value: SandboxProxy, ...method });
  }

  // A data cell's table: numeric columns arrive as Float64Array (NaN for an empty field); a text column, the CSV
  // text and the private copies the records of rows are built from are asked of the host when first read.
  const part = host.part;
  function buildRows(columns, values, numeric, n) {
    const rows = [];
    for (let i = 0; i < n; i++) {
      const row = {};
      for (let c = 0; c < columns.length; c++) {
        const v = values[c][i];
        setOwn(row, columns[c], numeric[c] && v !== v ? null : v);
      }
      rows[i] = row;
    }
    return rows;
  }
  function dataProperty(o, k, v) {
    defineProperty(o, k, { value: v, writable: true, enumerable: true, configurable: true });
  }
  // o[k] as an accessor that computes its value once, on first read, and then becomes a plain data property.
  function lazyProperty(o, k, compute) {
    defineProperty(o, k, {
      get: { [k]() {
        const v = compute();
        dataProperty(o, k, v);
        return v;
      } }[k],
      set: { [k](v) { dataProperty(o, k, v); } }[k],
      enumerable: true,
      configurable: true,
    });
  }
  function defineTable(name, index, wire) {
    const data = decode(wire);
    const columns = data.columns, numericValues = data.numeric, n = data.length;
    const numeric = [];
    const byColumn = {};
    const column = (c) => decode(part(index, c));
    for (let c = 0; c < columns.length; c++) {
      const isNumeric = numericValues[c] !== null;
      push(numeric, isNumeric);
      if (isNumeric) setOwn(byColumn, columns[c], numericValues[c]);
      else if (columns[c] === "__proto__") setOwn(byColumn, columns[c], column(c));
      else lazyProperty(byColumn, columns[c], () => column(c));
    }
    const table = {};
    dataProperty(table, "name", name);
    dataProperty(table, "columns", sliceArray(columns));
    lazyProperty(table, "rows", () => {
      const own = [];
      for (let c = 0; c < columns.length; c++) push(own, column(c));
      return buildRows(columns, own, numeric, n);
    });
    lazyProperty(table, "csv", () => {
      const text = part(index, -1);
      texts[index] = text;
      return text;
    });
    dataProperty(table, "byColumn", byColumn);
    defineProperty(G, name, { value: table, writable: false, enumerable: true, configurable: false });
  }
  function readGlobal(name) {
    let v;
    try {
      v = indirectEval(name);
    } catch (e) {
      throw new Err("no value named " + stringify(name) + " exists yet; define it in an earlier code cell or data cell");
    }
    return encode(v, "chart data " + stringify(name));
  }
  function displayCompletion(v) {
    const cell = cellNumber;
    cellNumber = cell + 1;
    if (v === undefined || (isDisplay(v) && shownGet(shownIn, v) === cell)) return undefined;
    return encode(toDisplay(v), "the cell's last expression");
  }

  meterBuiltins();

  const api = { aq: aq, charts: freeze(taggedCharts), show: show, control: control };
  const names = keysOf(api);
  for (let i = 0; i < names.length; i++) {
    defineProperty(G, names[i], { value: api[names[i]], writable: false, enumerable: false, configurable: false });
  }
  lockGlobalDefinitions();
  // The name, message and stack of a thrown value as one text ("4,7,NameMessageStack": the lengths of the name and
  // the message, then the three), read without JSON: a cell may
  // have given Object.prototype a toJSON, which would otherwise replace the message. undefined when there is no
  // message text (a thrown string, a plain object).
  function describeThrown(e) {
    if (e === null || (typeof e !== "object" && typeof e !== "function")) return undefined;
    const n = e.name, m = e.message, s = e.stack;
    if (typeof m !== "string") return undefined;
    const name = typeof n === "string" ? n : "Error";
    return name.length + "," + m.length + "," + name + m + (typeof s === "string" ? s : "");
  }

  return freeze({ defineTable: defineTable, readGlobal: readGlobal, displayCompletion: displayCompletion, describeThrown: describeThrown });
})`;
