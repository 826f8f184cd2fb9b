import Handlebars from 'handlebars';

/**
 * One section of a mail: a titled table (a digest's sites, saws, flags…) or, when it has no rows, a line
 * saying so. Cells are plain text; the templates escape them.
 */
export type MailSection = {
  title: string;
  intro?: string;
  columns: string[];
  rows: string[][];
  /** Said instead of the table when there are no rows. */
  empty: string;
  link?: { label: string; url: string };
};

/** Everything a mail says, in order; rendered to HTML and to plain text by the same templates' data. */
export type MailView = {
  subject: string;
  /** The line mail programs show beside the subject. */
  preheader: string;
  heading: string;
  paragraphs: string[];
  action?: { label: string; url: string };
  sections?: MailSection[];
  /** Small print under the action: how long a link works, what to do if the mail was not expected. */
  notes?: string[];
  /** Why the person gets this mail and where to change that. */
  footer: string;
  footerLink?: { label: string; url: string };
};

export type RenderedMail = { subject: string; html: string; text: string };

// Kerfline's print look in a mail: warm paper, graphite ink, one copper accent. Mail programs ignore most
// CSS in <style>, so every rule is inline; tables lay it out because that is what they all render alike.
const PAPER = '#F5F2EC';
const CARD = '#FFFDF9';
const INK = '#1E2226';
const MUTED = '#545C64';
const RULE = '#D8D1C4';
const ACCENT = '#A4502A';
const FONT = "Manrope, 'Segoe UI', Helvetica, Arial, sans-serif";

const HTML = `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>{{subject}}</title>
</head>
<body style="margin:0;padding:0;background:${PAPER};color:${INK};font-family:${FONT};">
<div style="display:none;max-height:0;overflow:hidden;">{{preheader}}</div>
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="background:${PAPER};">
<tr><td align="center" style="padding:24px 12px;">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="max-width:600px;">
<tr><td style="padding:0 4px 12px 4px;font-size:20px;font-weight:800;letter-spacing:-0.01em;color:${INK};">
<span style="display:inline-block;width:14px;height:14px;background:${ACCENT};border-radius:2px;vertical-align:-1px;margin-right:8px;"></span>Kerfline
</td></tr>
<tr><td style="background:${CARD};border:1px solid ${RULE};border-top:4px solid ${ACCENT};border-radius:6px;padding:24px;">
<h1 style="margin:0 0 16px 0;font-size:22px;line-height:1.3;font-weight:800;color:${INK};">{{heading}}</h1>
{{#each paragraphs}}<p style="margin:0 0 12px 0;font-size:15px;line-height:1.55;color:${INK};">{{this}}</p>
{{/each}}
{{#if action}}<table role="presentation" cellpadding="0" cellspacing="0" style="margin:20px 0;"><tr>
<td style="background:${ACCENT};border-radius:6px;"><a href="{{action.url}}" style="display:inline-block;padding:13px 22px;font-size:15px;font-weight:700;color:${CARD};text-decoration:none;">{{action.label}}</a></td>
</tr></table>
<p style="margin:0 0 16px 0;font-size:13px;line-height:1.5;color:${MUTED};">If the button does not work, open this address:<br><a href="{{action.url}}" style="color:${ACCENT};word-break:break-all;">{{action.url}}</a></p>
{{/if}}
{{#each sections}}<h2 style="margin:24px 0 8px 0;font-size:16px;font-weight:800;color:${INK};border-bottom:1px solid ${RULE};padding-bottom:6px;">{{title}}</h2>
{{#if intro}}<p style="margin:0 0 8px 0;font-size:14px;line-height:1.5;color:${MUTED};">{{intro}}</p>{{/if}}
{{#if rows.length}}<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="border-collapse:collapse;font-size:14px;">
<tr>{{#each columns}}<th align="left" style="padding:6px 8px 6px 0;color:${MUTED};font-weight:600;border-bottom:1px solid ${RULE};">{{this}}</th>{{/each}}</tr>
{{#each rows}}<tr>{{#each this}}<td style="padding:6px 8px 6px 0;border-bottom:1px solid ${RULE};color:${INK};font-variant-numeric:tabular-nums;">{{this}}</td>{{/each}}</tr>
{{/each}}</table>
{{else}}<p style="margin:0;font-size:14px;color:${MUTED};">{{empty}}</p>{{/if}}
{{#if link}}<p style="margin:8px 0 0 0;font-size:14px;"><a href="{{link.url}}" style="color:${ACCENT};font-weight:700;">{{link.label}}</a></p>{{/if}}
{{/each}}
{{#each notes}}<p style="margin:12px 0 0 0;font-size:13px;line-height:1.5;color:${MUTED};">{{this}}</p>
{{/each}}
</td></tr>
<tr><td style="padding:14px 4px;font-size:12px;line-height:1.5;color:${MUTED};">{{footer}}{{#if footerLink}} <a href="{{footerLink.url}}" style="color:${MUTED};">{{footerLink.label}}</a>{{/if}}</td></tr>
</table>
</td></tr>
</table>
</body>
</html>
`;

const TEXT = `KERFLINE
{{heading}}

{{#each paragraphs}}{{this}}

{{/each}}
{{#if action}}{{action.label}}:
{{action.url}}

{{/if}}
{{#each sections}}== {{title}} ==
{{#if intro}}{{intro}}
{{/if}}
{{#if rows.length}}{{#each rows}}- {{join this}}
{{/each}}{{else}}{{empty}}
{{/if}}
{{#if link}}{{link.label}}: {{link.url}}
{{/if}}

{{/each}}
{{#each notes}}{{this}}
{{/each}}
--
{{footer}}{{#if footerLink}} {{footerLink.label}}: {{footerLink.url}}{{/if}}
`;

const handlebars = Handlebars.create();
handlebars.registerHelper('join', (cells: unknown) => (Array.isArray(cells) ? cells.map(String).join(' · ') : ''));

// HTML escapes every value ({{ }} only; there is no {{{ }}} in the template). The text version is not HTML,
// so escaping there would only garble names such as "Smith & Sons".
const html = handlebars.compile<MailView>(HTML, { strict: false });
const text = handlebars.compile<MailView>(TEXT, { noEscape: true, strict: false });

export function renderMail(view: MailView): RenderedMail {
  return {
    subject: view.subject.replace(/[\r\n]+/g, ' '),
    html: html(view),
    text: text(view).replace(/\n{3,}/g, '\n\n'),
  };
}

/** A link into the web app from the configured public address; values in the path are encoded. */
export function appLink(publicUrl: string, path: string, fragment?: Record<string, string>): string {
  const base = publicUrl.replace(/\/+$/, '');
  const hash = fragment ? `#${new URLSearchParams(fragment).toString()}` : '';
  return `${base}${path.startsWith('/') ? path : `/${path}`}${hash}`;
}
