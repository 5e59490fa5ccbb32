import { initials } from '../../shared/initials';
import type { FakeIdentity } from './fake-oauth-identities';

const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

export interface AuthorizeRequest {
  clientId: string;
  redirectUri: string;
  state: string;
}

function hiddenFields(request: AuthorizeRequest) {
  return `<input type="hidden" name="client_id" value="${escapeHtml(request.clientId)}">
<input type="hidden" name="redirect_uri" value="${escapeHtml(request.redirectUri)}">
<input type="hidden" name="state" value="${escapeHtml(request.state)}">`;
}

// The local stand-in's consent page: pick one of the identities kept on this
// machine, or make up a new one. Deliberately plain and clearly labelled as a
// local test tool, so nobody mistakes it for a real sign-in service.
export function authorizePage(request: AuthorizeRequest, identities: FakeIdentity[], problem?: string): string {
  const rows = identities
    .map(
      (identity) => `<li><form method="post" action="/authorize/approve">${hiddenFields(request)}
<input type="hidden" name="login" value="${escapeHtml(identity.login)}">
<button type="submit" class="identity"><span class="initials" aria-hidden="true">${escapeHtml(initials(identity.name))}</span>
<span><strong>${escapeHtml(identity.name)}</strong><br><small>@${escapeHtml(identity.login)} · ${escapeHtml(identity.email)}</small></span></button>
</form></li>`,
    )
    .join('\n');
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Local sign-in stand-in</title><link rel="icon" href="data:,">
<style>
  body { margin: 0; font-family: system-ui, sans-serif; background: repeating-linear-gradient(135deg, #efebe2 0 14px, #f8f6f1 14px 28px); color: #1d2428; }
  main { max-width: 36rem; margin: 6vh auto; padding: 2rem; background: #fff; border: 2px dashed #96421a; border-radius: 0.5rem; }
  .badge { display: inline-block; font-size: 0.75rem; font-weight: 700; letter-spacing: 0.08em; text-transform: uppercase; color: #96421a; }
  h1 { font-size: 1.4rem; margin: 0.25rem 0 0.5rem; }
  h2 { font-size: 1.05rem; margin: 1.75rem 0 0.5rem; }
  p { color: #4a5358; line-height: 1.5; }
  ul { list-style: none; padding: 0; margin: 0; display: grid; gap: 0.5rem; }
  .identity { display: flex; gap: 0.75rem; align-items: center; width: 100%; text-align: left; font: inherit; padding: 0.6rem 0.75rem; background: #f8f6f1; border: 1px solid #ddd6c8; border-radius: 0.5rem; cursor: pointer; }
  .identity:hover { border-color: #1d5557; }
  .initials { display: inline-grid; place-items: center; width: 2.25rem; height: 2.25rem; border-radius: 0.4rem; background: #1d5557; color: #fff; font-weight: 700; }
  small { color: #4a5358; }
  label { display: block; font-weight: 600; margin-top: 0.75rem; }
  input[type=text], input[type=email] { width: 100%; box-sizing: border-box; font: inherit; padding: 0.45rem 0.6rem; border: 1px solid #6b7378; border-radius: 0.4rem; }
  .actions { display: flex; gap: 0.75rem; margin-top: 1rem; }
  .primary { font: inherit; padding: 0.5rem 1.1rem; border: 0; border-radius: 0.4rem; background: #96421a; color: #fff; cursor: pointer; }
  .secondary { font: inherit; padding: 0.5rem 1.1rem; border: 1px solid #6b7378; border-radius: 0.4rem; background: #fff; cursor: pointer; }
  .problem { padding: 0.5rem 0.75rem; background: #f8dede; color: #7c1a1a; border-radius: 0.4rem; }
  :focus-visible { outline: 3px solid #eb9a6c; outline-offset: 2px; }
</style></head>
<body><main>
<span class="badge">Local test provider · nothing leaves this machine</span>
<h1>Who do you want to be?</h1>
<p>This page stands in for the real sign-in service while Crosswatt runs on your computer. Choose an identity, or make one up.</p>
${problem ? `<p class="problem" role="alert">${escapeHtml(problem)}</p>` : ''}
<h2>Identities on this machine</h2>
${identities.length ? `<ul>${rows}</ul>` : '<p>None yet: create the first one below.</p>'}
<h2>Create an identity</h2>
<form method="post" action="/authorize/create">${hiddenFields(request)}
<label for="name">Name</label><input type="text" id="name" name="name" required maxlength="80" autocomplete="off">
<label for="login">Handle</label><input type="text" id="login" name="login" required maxlength="39" pattern="[A-Za-z0-9](?:[A-Za-z0-9]|-(?=[A-Za-z0-9])){0,38}" autocomplete="off">
<label for="email">E-mail</label><input type="email" id="email" name="email" required maxlength="200" autocomplete="off">
<div class="actions"><button type="submit" class="primary">Create and continue</button></div>
</form>
<form method="post" action="/authorize/deny">${hiddenFields(request)}
<div class="actions"><button type="submit" class="secondary">Cancel sign-in</button></div>
</form>
</main></body></html>`;
}
