/** A message ready to queue: plain text and the same content as simple HTML. */
export type EmailContent = { subject: string; text: string; html: string };

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

/** Builds a message from paragraphs and one call-to-action link. */
export function composeEmail(subject: string, paragraphs: string[], action?: { label: string; url: string }, footer?: string): EmailContent {
  const textParts = [...paragraphs];
  if (action) textParts.push(`${action.label}: ${action.url}`);
  if (footer) textParts.push(footer);
  textParts.push("— Tagloom");
  const htmlParts = paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`);
  if (action) {
    htmlParts.push(
      `<p><a href="${escapeHtml(action.url)}" style="display:inline-block;padding:10px 16px;background:#1d3557;color:#fff;border-radius:6px;text-decoration:none">${escapeHtml(action.label)}</a></p>`,
      `<p style="font-size:12px;color:#3e6590">Or open this address: ${escapeHtml(action.url)}</p>`,
    );
  }
  if (footer) htmlParts.push(`<p style="font-size:12px;color:#3e6590">${escapeHtml(footer)}</p>`);
  htmlParts.push("<p>— Tagloom</p>");
  return {
    subject,
    text: textParts.join("\n\n"),
    html: `<!doctype html><html><body style="font-family:sans-serif;color:#0f1d30">${htmlParts.join("\n")}</body></html>`,
  };
}
