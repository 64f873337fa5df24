// Hostile values for text, numbers and JSON shapes: a fixed list everyone can read, and fast-check arbitraries
// sampled with fixed seeds so every run sends the same bytes (the seed is part of each case's name).
import fc from "fast-check";

/** Markup that would run if a page ever put stored text into the document as HTML. Each sets window.__hostile. */
export const SCRIPT_PAYLOADS = [
  `<script>window.__hostile=1</script>`,
  `<img src=x onerror="window.__hostile=2">`,
  `"><svg onload=window.__hostile=3>`,
  `</textarea></title><script>window.__hostile=4</script>`,
  `<a href="javascript:window.__hostile=5">open</a>`,
  `<iframe srcdoc="<script>parent.__hostile=6</script>"></iframe>`,
  `'};window.__hostile=7;//`,
  `<style>@import 'http://x.invalid/a.css';</style><b onmouseover=window.__hostile=8>hover</b>`,
] as const;

/** What must never appear raw in a rendered page once the payloads above are stored. */
export const RAW_MARKERS = [`<script>window.__hostile`, `<img src=x onerror`, `<svg onload`, `<iframe srcdoc`, `<b onmouseover`, `href="javascript:`];

/** Text that is awkward rather than malicious: every one must be stored as typed or refused, never a crash. */
export const UNICODE_EDGES: Record<string, string> = {
  loneHighSurrogate: "Pipe \ud800 run",
  loneLowSurrogate: "Pipe \udfff run",
  reversedSurrogates: "\udc00\ud800 run",
  rtlOverride: "Geyser \u202egnp.exe\u202c on roof",
  zeroWidth: "Dis\u200bcharge\u200c\u200d\ufeff pipe",
  nul: "Valve\u0000 pipe",
  onlyNul: "\u0000\u0000\u0000\u0000",
  controls: "Tab\tBell\u0007Esc\u001bDel\u007f",
  combining: "e\u0301".repeat(300),
  emoji: "Shower 🚿 hot 🔥 plumber 👩🏽‍🔧 flag 🏳️‍🌈",
  long10k: "x".repeat(10_000),
  long10kEmoji: "🚿".repeat(10_000),
  whitespaceOnly: " \u00a0\u2003\t\n ",
  crlfInjection: "line\r\nSet-Cookie: hostile=1\r\n\r\n<b>body</b>",
  percent: "%00%0d%0a%E0%A4%A",
  backslashes: "C:\\Windows\\..\\..\\\\server\\share",
  sqlish: "' OR '1'='1' --; \" OR \"\"=\"",
  template: "${7*7} {{7*7}} #{7*7} <%= 7*7 %>",
};

export const TEXT_HOSTILES: Record<string, string> = {
  ...Object.fromEntries(SCRIPT_PAYLOADS.map((p, i) => [`script${i + 1}`, p])),
  ...UNICODE_EDGES,
};

/** Route parameters that are not the UUID the route expects (sent percent-encoded where needed). */
export const BAD_IDS: string[] = [
  "not-a-uuid",
  "123",
  "-1",
  "NaN",
  "00000000-0000-0000-0000-000000000000",
  "ffffffff-ffff-ffff-ffff-ffffffffffff",
  "ZZZZZZZZ-ZZZZ-ZZZZ-ZZZZ-ZZZZZZZZZZZZ",
  "0f8fad5b-d9cb-469f-a165-70867728950e-extra",
  "0f8fad5bd9cb469fa16570867728950e",
  "{0f8fad5b-d9cb-469f-a165-70867728950e}",
  "' OR '1'='1",
  "..%2F..%2Fetc%2Fpasswd",
  "%00",
  "%E0%A4%A",
  "%uD800",
  "%F0%9F%9A%BF",
  "%3Cscript%3E",
  "a".repeat(2000),
  "%20",
];

/** JSON values of every type, for a field that expects something else. */
export const WRONG_TYPES: Record<string, unknown> = {
  null: null,
  true: true,
  zero: 0,
  negative: -1,
  float: 3.5,
  bigNumber: 1e308,
  emptyString: "",
  emptyArray: [],
  array: ["a", 1, null],
  emptyObject: {},
  object: { $gt: "", __proto__: { polluted: 1 } },
  protoKey: JSON.parse('{"__proto__":{"polluted":1}}'),
  nested: { a: { b: { c: { d: [1, [2, [3]]] } } } },
};

/** A raw JSON number token (not expressible through JSON.stringify): Infinity, -Infinity and a bad token. */
export const RAW_NUMBERS = { infinity: "1e999", negInfinity: "-1e999", tiny: "1e-999", longDigits: "9".repeat(400) };
const RAW = "__raw_json_token__:";
export const raw = (token: string) => `${RAW}${token}`;
/** JSON.stringify, but `raw(...)` strings become bare tokens (1e999 parses to Infinity on the server). */
export function toJsonText(value: unknown) {
  return JSON.stringify(value).replace(new RegExp(`"${RAW}([^"]*)"`, "g"), "$1");
}

/** Numbers a measurement or calculator input must refuse or handle: not finite, not numbers, absurd. */
export const BAD_NUMBERS: Record<string, unknown> = {
  infinity: raw(RAW_NUMBERS.infinity),
  negInfinity: raw(RAW_NUMBERS.negInfinity),
  nanString: "NaN",
  infinityString: "Infinity",
  text: "12abc",
  null: null,
  array: [1],
  object: { value: 1 },
  hugeNegative: -1e308,
  huge: 1e308,
};

/** Deeply nested JSON text, built as text so the client never recurses. */
export function deepJson(depth: number, open = "[", close = "]") {
  return open.repeat(depth) + close.repeat(depth);
}

/** fast-check samples with a fixed seed: the same values on every run. */
export function sample<T>(arb: fc.Arbitrary<T>, seed: number, count: number): T[] {
  return fc.sample(arb, { seed, numRuns: count });
}

/** Any JSON-ish value, including strings with lone surrogates and other odd code points. */
export const anyJson = fc.oneof(
  fc.jsonValue(),
  fc.string({ unit: "binary", maxLength: 80 }),
  fc.array(fc.string({ unit: "binary", maxLength: 8 }), { maxLength: 5 }),
  fc.double(),
  fc.integer(),
  fc.constant(null),
);

/** Text with any code points (lone surrogates, controls, NUL, astral), and sometimes long. */
export const anyText = fc.oneof(
  fc.string({ unit: "binary", maxLength: 200 }),
  fc.string({ unit: "grapheme", minLength: 1, maxLength: 60 }),
  fc.constantFrom(...Object.values(TEXT_HOSTILES)),
  fc.string({ unit: "binary-ascii", minLength: 150, maxLength: 5000 }),
);

/** A number arbitrary that includes the raw tokens JSON.stringify would otherwise hide. */
export const anyNumberish = fc.oneof(
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.integer({ min: -2_000_000_000, max: 2_000_000_000 }),
  fc.constantFrom(...Object.values(BAD_NUMBERS)),
  fc.string({ maxLength: 12 }),
);
