// Reading a number the user typed. Nothing here converts or rounds: the caller gets the number as
// typed (in the shown units) or the reason in words, and the last good value stays in the job.
//
// A comma is read as a decimal comma only where it cannot be a thousands separator ("1,5" is 1.5).
// "2,500" or "1,200" could be either, so it is refused with the fix in words (common practice, no
// source: shop figures are written both ways, and guessing wrong is a factor of 1000).
const PLAIN = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;
const THOUSANDS = /^[-+]?\d{1,3}(,\d{3})+(\.\d*)?$/;

export function readNumber(typed) {
  const text = typed.trim();
  if (THOUSANDS.test(text)) {
    return { error: `use a point for decimals: ${text} was not taken (write ${text.replace(/,/g, "")} or ${text.replace(",", ".")})` };
  }
  const commas = (text.match(/,/g) || []).length;
  const normal = commas === 1 && !text.includes(".") ? text.replace(",", ".") : text;
  if (!PLAIN.test(normal)) return { error: `"${text}" is not a number` };
  const value = Number(normal);
  if (!Number.isFinite(value) || Math.abs(value) > 1e12) return { error: `${text} is far too large to be a real value` };
  if (value !== 0 && Math.abs(value) < 1e-9) return { error: `${text} is far too small to be a real value` };
  return { value };
}

// The declared limits of a field (data-ge, data-gt, data-le, data-lt on its input, from the job
// model), checked on the value in engine units; the words show the limits in the shown units.
export function outOfRange(value, input, shownLimit) {
  const d = input.dataset;
  const rules = [["ge", (v, x) => v >= x, "at least"], ["gt", (v, x) => v > x, "more than"],
    ["le", (v, x) => v <= x, "at most"], ["lt", (v, x) => v < x, "less than"]];
  for (const [key, ok, words] of rules) {
    if (d[key] === undefined) continue;
    const limit = Number(d[key]);
    if (!ok(value, limit)) return `must be ${words} ${shownLimit(limit)}`;
  }
  return null;
}
