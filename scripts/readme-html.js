// Turns README.md into dist/README.html, the page the functions' @helpurl links point to
// (https://localhost:3000/README.html#fwfan …). A small converter for the Markdown the README uses:
// headings (with GitHub-style anchors), paragraphs, lists, fenced code, inline code, bold, links,
// block quotes and tables. No scripts in the output.
"use strict";

function esc(s) {
  return s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;");
}

/** GitHub-style anchor: lower case, punctuation removed, spaces to hyphens. */
function anchor(text) {
  return text.toLowerCase().replace(/[^\p{L}\p{N} _-]/gu, "").trim().replace(/ /g, "-");
}

function inline(s) {
  const parts = s.split(/(`[^`]*`)/);
  return parts.map((p) => {
    if (p.startsWith("`") && p.endsWith("`") && p.length >= 2) return `<code>${esc(p.slice(1, -1))}</code>`;
    return esc(p)
      .replace(/\*\*([^*]+)\*\*/g, "<strong>$1</strong>")
      .replace(/\[([^\]]+)\]\(([^)\s]+)\)/g, (_m, t, u) => `<a href="${u.replace(/"/g, "%22")}">${t}</a>`);
  }).join("");
}

function markdownToHtml(md, title) {
  const lines = md.split(/\r?\n/);
  const out = [];
  let i = 0;
  let para = [];
  const flush = () => {
    if (para.length) out.push(`<p>${inline(para.join(" "))}</p>`);
    para = [];
  };
  while (i < lines.length) {
    const line = lines[i];
    if (line.startsWith("```")) {
      flush();
      const code = [];
      i++;
      while (i < lines.length && !lines[i].startsWith("```")) code.push(lines[i++]);
      i++;
      out.push(`<pre><code>${esc(code.join("\n"))}</code></pre>`);
      continue;
    }
    const h = /^(#{1,6}) (.*)$/.exec(line);
    if (h) {
      flush();
      const level = h[1].length;
      out.push(`<h${level} id="${anchor(h[2])}">${inline(h[2])}</h${level}>`);
      i++;
      continue;
    }
    if (/^\s*[-*] /.test(line)) {
      flush();
      const items = [];
      while (i < lines.length && (/^\s*[-*] /.test(lines[i]) || (/^\s{2,}\S/.test(lines[i]) && items.length))) {
        if (/^\s*[-*] /.test(lines[i])) items.push(lines[i].replace(/^\s*[-*] /, ""));
        else items[items.length - 1] += " " + lines[i].trim();
        i++;
      }
      out.push(`<ul>${items.map((t) => `<li>${inline(t)}</li>`).join("")}</ul>`);
      continue;
    }
    if (/^\d+\. /.test(line)) {
      flush();
      const items = [];
      while (i < lines.length && (/^\d+\. /.test(lines[i]) || (/^\s{2,}\S/.test(lines[i]) && items.length))) {
        if (/^\d+\. /.test(lines[i])) items.push(lines[i].replace(/^\d+\. /, ""));
        else items[items.length - 1] += " " + lines[i].trim();
        i++;
      }
      out.push(`<ol>${items.map((t) => `<li>${inline(t)}</li>`).join("")}</ol>`);
      continue;
    }
    if (line.startsWith(">")) {
      flush();
      const q = [];
      while (i < lines.length && lines[i].startsWith(">")) q.push(lines[i++].replace(/^>\s?/, ""));
      out.push(`<blockquote><p>${inline(q.join(" "))}</p></blockquote>`);
      continue;
    }
    if (line.startsWith("|")) {
      flush();
      const rows = [];
      while (i < lines.length && lines[i].startsWith("|")) rows.push(lines[i++]);
      const cells = (r) => r.replace(/^\||\|$/g, "").split(/(?<!\\)\|/).map((c) => c.trim().replace(/\\\|/g, "|"));
      const head = cells(rows[0]);
      const body = rows.slice(2).map(cells);
      out.push(`<table><thead><tr>${head.map((c) => `<th>${inline(c)}</th>`).join("")}</tr></thead><tbody>${body.map((r) => `<tr>${r.map((c) => `<td>${inline(c)}</td>`).join("")}</tr>`).join("")}</tbody></table>`);
      continue;
    }
    if (line.trim() === "") {
      flush();
      i++;
      continue;
    }
    para.push(line.trim());
    i++;
  }
  flush();
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src 'self'">
<title>${esc(title)}</title>
<style>body{font-family:system-ui,-apple-system,"Segoe UI",Roboto,sans-serif;color:#3b3b3b;background:#fffdf8;max-width:46em;margin:0 auto;padding:1em 1.2em;line-height:1.5}
h1,h2,h3{color:#5a2d82}code{background:#f4e3bf;padding:0 .2em}pre{background:#f6f1e6;padding:.6em;overflow-x:auto}pre code{background:none}
table{border-collapse:collapse}td,th{border:1px solid #d9d2c3;padding:.2em .4em}blockquote{border-left:4px solid #d4973a;margin-left:0;padding-left:.8em}</style>
</head><body>
<p><em>Generated from README.md by scripts/readme-html.js.</em></p>
${out.join("\n")}
</body></html>
`;
}

module.exports = { markdownToHtml, anchor };
