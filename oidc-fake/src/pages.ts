import type { DemoUser } from './users';

/**
 * The provider's own pages, rendered on the server. Everything interpolated goes through
 * `escapeHtml`; the only markup taken as-is is the logout form that oidc-provider itself builds.
 * Styles and the one script are served files (see ASSETS), so the content security policy needs no
 * inline allowance.
 */

export const PAGE_TITLE = 'Tamsk identity (development)';

export function escapeHtml(value: string): string {
  return value
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

interface Shell {
  title: string;
  main: string;
  scripts?: string[];
}

function page({ title, main, scripts = [] }: Shell): string {
  const scriptTags = scripts.map((src) => `<script src="${escapeHtml(src)}" defer></script>`).join('');
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="robots" content="noindex">
<title>${escapeHtml(title)}</title>
<link rel="stylesheet" href="${ASSET_PATHS.stylesheet}">
${scriptTags}
</head>
<body>
<div class="frame">
<header class="masthead">
<span class="mark" aria-hidden="true"></span>
<span class="wordmark">Tamsk identity <span class="badge">development</span></span>
</header>
<main>
${main}
</main>
<footer class="footnote">
Tamsk Aerodynamics and everyone on this page are invented demo data for developing Laminote.
This provider runs on your own machine for development and tests; it is not a sign-in service.
</footer>
</div>
</body>
</html>
`;
}

function roleLabel(user: DemoUser): string {
  if (user.siteAdmin) {
    return 'site admin';
  }
  return user.role ?? 'no project';
}

function initials(name: string): string {
  return name
    .split(/\s+/)
    .filter((part) => part.length > 0)
    .map((part) => part.charAt(0).toUpperCase())
    .slice(0, 2)
    .join('');
}

export interface SignInView {
  uid: string;
  clientName: string;
  users: readonly DemoUser[];
  /** Shown above the list when the last submission was refused. */
  error?: string;
}

export function signInPage({ uid, clientName, users, error }: SignInView): string {
  const base = `/interaction/${encodeURIComponent(uid)}`;
  const people = users
    .map((user, index) => {
      const id = `person-${index}`;
      return `<li>
<button type="submit" name="sub" value="${escapeHtml(user.sub)}" class="person" aria-labelledby="${id}-name" aria-describedby="${id}-about ${id}-role">
<span class="initials" aria-hidden="true">${escapeHtml(initials(user.name))}</span>
<span class="who">
<span class="name" id="${id}-name"><span class="visually-hidden">Sign in as </span>${escapeHtml(user.name)}</span>
<span class="about" id="${id}-about"><span class="title">${escapeHtml(user.title)}</span> <span class="email">${escapeHtml(user.email)}</span></span>
</span>
<span class="role" id="${id}-role">${escapeHtml(roleLabel(user))}</span>
</button>
</li>`;
    })
    .join('\n');
  const alert = error
    ? `<div class="alert" role="alert"><p>${escapeHtml(error)}</p></div>`
    : '';
  return page({
    title: PAGE_TITLE,
    main: `<h1>Choose who to sign in as</h1>
<p class="lede">A local development identity provider with invented users. Pick a person to sign in to
<strong>${escapeHtml(clientName)}</strong> as them; no password is asked.</p>
${alert}
<form method="post" action="${escapeHtml(`${base}/login`)}" class="people">
<ul class="people-list">
${people}
</ul>
</form>
<form method="post" action="${escapeHtml(`${base}/abort`)}" class="cancel">
<button type="submit" class="quiet">Cancel and return to ${escapeHtml(clientName)}</button>
</form>`,
  });
}

/**
 * The confirmation oidc-provider asks for at RP-initiated logout. `providerForm` is the provider's own
 * empty form carrying its anti-forgery token; the button submits it, and the served script presses
 * the button at once, so a person with scripts on never has to.
 */
export function signOutPage(providerForm: string, clientName: string | undefined): string {
  const from = clientName ? ` of ${escapeHtml(clientName)}` : '';
  return page({
    title: `Signing out · ${PAGE_TITLE}`,
    scripts: [ASSET_PATHS.signOutScript],
    main: `<h1>Signing you out${from}</h1>
<p class="lede">Ending your session with this development provider.</p>
${providerForm}
<button type="submit" form="op.logoutForm" name="logout" value="yes" id="sign-out" class="primary">Sign out</button>`,
  });
}

export function signedOutPage(clientName: string | undefined): string {
  const from = clientName ? ` of ${escapeHtml(clientName)}` : '';
  return page({
    title: `Signed out · ${PAGE_TITLE}`,
    main: `<h1>You are signed out${from}</h1>
<p class="lede">Your session with this development provider has ended. You can close this tab.</p>`,
  });
}

export interface ErrorView {
  heading: string;
  message: string;
  /** The OAuth error code, when there is one; shown for developers. */
  code?: string;
}

export function errorPage({ heading, message, code }: ErrorView): string {
  const detail = code ? `<p class="code">Error code: <code>${escapeHtml(code)}</code></p>` : '';
  return page({
    title: `${heading} · ${PAGE_TITLE}`,
    main: `<h1>${escapeHtml(heading)}</h1>
<div class="alert" role="alert"><p>${escapeHtml(message)}</p></div>
${detail}`,
  });
}

export const ASSET_PATHS = {
  stylesheet: '/assets/tamsk-identity.css',
  signOutScript: '/assets/sign-out.js',
} as const;

const STYLESHEET = `
:root {
  color-scheme: light;
  --ink: #1d2830;
  --muted: #56636c;
  --paper: #eef0ea;
  --card: #fbfcf8;
  --line: #c9d0c4;
  --accent: #2c6a5c;
  --accent-deep: #1f4d43;
  --accent-wash: #dcebe4;
  --focus: #b8741a;
  --alert: #8c2f1c;
  --alert-wash: #f7e3dc;
}
* { box-sizing: border-box; }
html { font-size: 100%; }
body {
  margin: 0;
  min-height: 100vh;
  background: var(--paper);
  color: var(--ink);
  font: 1rem/1.5 system-ui, sans-serif;
}
.frame { max-width: 46rem; margin: 0 auto; padding: 2rem 1.25rem 3rem; }
.masthead { display: flex; align-items: center; gap: .75rem; margin-bottom: 2rem; }
.mark {
  width: 2.25rem; height: 2.25rem; border-radius: .6rem .6rem .6rem 0;
  background:
    linear-gradient(90deg, var(--accent) 0 50%, transparent 50%) .3rem .5rem / calc(100% - .6rem) 3px no-repeat,
    linear-gradient(90deg, var(--accent) 0 75%, transparent 75%) .3rem .95rem / calc(100% - .6rem) 3px no-repeat,
    linear-gradient(90deg, var(--accent) 0 100%, transparent 100%) .3rem 1.4rem / calc(100% - .6rem) 3px no-repeat,
    var(--accent-wash);
  border: 1px solid var(--accent);
}
.wordmark { font-weight: 700; font-size: 1.15rem; letter-spacing: .01em; }
.badge {
  margin-left: .4rem; padding: .05rem .45rem; border-radius: 999px;
  background: var(--ink); color: var(--paper);
  font-size: .7rem; font-weight: 600; letter-spacing: .08em; text-transform: uppercase; vertical-align: middle;
}
h1 { font-size: 1.6rem; line-height: 1.25; margin: 0 0 .5rem; }
.lede { margin: 0 0 1.5rem; color: var(--muted); max-width: 38rem; }
.lede strong { color: var(--ink); }
.alert {
  margin: 0 0 1.25rem; padding: .75rem 1rem; border-left: 4px solid var(--alert);
  background: var(--alert-wash); color: var(--alert); border-radius: 0 .4rem .4rem 0;
}
.alert p { margin: 0; }
.people { margin: 0; }
.people-list {
  list-style: none; margin: 0; padding: 0;
  display: grid; gap: .75rem; grid-template-columns: repeat(auto-fill, minmax(19rem, 1fr));
}
.person {
  width: 100%; display: grid; grid-template-columns: auto 1fr; grid-template-rows: auto auto;
  column-gap: .85rem; row-gap: .35rem; align-items: center; text-align: left;
  padding: .85rem 1rem; border: 1px solid var(--line); border-radius: .6rem;
  background: var(--card); color: inherit; font: inherit; cursor: pointer;
}
.person:hover { border-color: var(--accent); background: #fff; }
.person:focus-visible, button:focus-visible { outline: 3px solid var(--focus); outline-offset: 2px; }
.initials {
  grid-row: 1 / span 2; width: 2.6rem; height: 2.6rem; border-radius: 50%;
  display: grid; place-items: center; background: var(--accent-wash); color: var(--accent-deep); font-weight: 700;
}
.who { display: flex; flex-direction: column; min-width: 0; }
.name { font-weight: 650; }
.about { color: var(--muted); font-size: .9rem; display: flex; flex-direction: column; }
.email { font-family: ui-monospace, monospace; font-size: .82rem; overflow-wrap: anywhere; }
.role {
  grid-column: 2; justify-self: start; padding: .05rem .5rem; border-radius: .3rem;
  border: 1px solid var(--accent); color: var(--accent-deep); font-size: .75rem; font-weight: 600;
  letter-spacing: .04em; text-transform: uppercase;
}
.cancel { margin-top: 1.5rem; }
.quiet {
  background: none; border: none; padding: .25rem 0; color: var(--accent-deep);
  font: inherit; text-decoration: underline; cursor: pointer;
}
.primary {
  padding: .6rem 1.4rem; border: none; border-radius: .45rem; background: var(--accent); color: #fff;
  font: inherit; font-weight: 600; cursor: pointer;
}
.primary:hover { background: var(--accent-deep); }
.code { color: var(--muted); font-size: .9rem; }
code { font-family: ui-monospace, monospace; }
.footnote { margin-top: 3rem; padding-top: 1rem; border-top: 1px solid var(--line); color: var(--muted); font-size: .82rem; }
.visually-hidden {
  position: absolute; width: 1px; height: 1px; margin: -1px; padding: 0; border: 0;
  overflow: hidden; clip: rect(0 0 0 0); white-space: nowrap;
}
@media (prefers-reduced-motion: no-preference) { .person { transition: border-color .12s, background-color .12s; } }
`;

// Submits the sign-out form as if its button were pressed, so the visible page is only a fallback.
const SIGN_OUT_SCRIPT = `document.addEventListener('DOMContentLoaded', function () {
  var button = document.getElementById('sign-out');
  if (button && button.form) { button.form.requestSubmit(button); }
});
`;

export const ASSETS: ReadonlyMap<string, { type: string; body: string }> = new Map([
  [ASSET_PATHS.stylesheet, { type: 'text/css; charset=utf-8', body: STYLESHEET }],
  [ASSET_PATHS.signOutScript, { type: 'text/javascript; charset=utf-8', body: SIGN_OUT_SCRIPT }],
]);

/**
 * Headers for every page the provider renders. `formTargets` are the origins a form on these pages
 * may end up at: browsers apply `form-action` to the redirects after a submission too, and signing in
 * or out ends with a redirect to the application.
 */
export function pageSecurityHeaders(formTargets: readonly string[]): Record<string, string> {
  const formAction = ["'self'", ...formTargets].join(' ');
  return {
    'Content-Security-Policy': [
      "default-src 'none'",
      "style-src 'self'",
      "script-src 'self'",
      "img-src 'self'",
      `form-action ${formAction}`,
      "frame-ancestors 'none'",
      "base-uri 'none'",
    ].join('; '),
    'X-Content-Type-Options': 'nosniff',
    'Referrer-Policy': 'no-referrer',
    'X-Frame-Options': 'DENY',
    'Cache-Control': 'no-store',
  };
}
