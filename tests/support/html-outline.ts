/**
 * The text and structure of an exported report as plain lines, for golden tests that must not depend on the
 * bytes of SVG drawings or of the stylesheet: headings as "#" lines, captions, table rows as "| a | b |",
 * paragraphs and list items as lines, drawings as "[drawing]", SHA-256 digests as "<sha256>".
 */
const ENTITIES: Record<string, string> = { "&amp;": "&", "&lt;": "<", "&gt;": ">", "&quot;": '"', "&#39;": "'" };

function decode(text: string): string {
  return text.replace(/&(amp|lt|gt|quot|#39);/g, (e) => ENTITIES[e]!);
}

/** The outline of a report's HTML. */
export function reportOutline(html: string): string {
  let body = html
    .replace(/<head>[\s\S]*?<\/head>/, "")
    .replace(/<svg[\s\S]*?<\/svg>/g, "[drawing]")
    .replace(/<details[^>]*><summary>([\s\S]*?)<\/summary>[\s\S]*?<\/details>/g, "\n[collapsed: $1]\n");
  body = body
    .replace(/<h([1-6])[^>]*>/g, (_, n: string) => `\n${"#".repeat(Number(n))} `)
    .replace(/<\/h[1-6]>/g, "\n")
    .replace(/<caption>/g, "\n")
    .replace(/<\/caption>/g, "\n")
    .replace(/<figcaption>/g, "\n")
    .replace(/<tr[^>]*>/g, "\n| ")
    .replace(/<t[dh]\b[^>]*>/g, " ")
    .replace(/<\/t[dh]>/g, " |")
    .replace(/<(p|li|dt|dd|div|section|header|footer|nav|figure|table|ul|ol|br)\b[^>]*>/g, "\n")
    .replace(/<[^>]+>/g, "");
  return decode(body)
    .split("\n")
    .map((l) => l.replace(/[ \t]+/g, " ").trim())
    .filter((l) => l !== "")
    .join("\n")
    .replace(/\b[0-9a-f]{64}\b/g, "<sha256>")
    .concat("\n");
}
