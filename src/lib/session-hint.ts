// Whether this browser was signed in when it last asked: a hint kept in localStorage (never a
// credential — the session cookie is httpOnly and the server decides). With no hint, a visitor is
// shown the sign-in form at once instead of a loading bar while /api/me answers; the answer still
// comes, and a signed-in visitor is taken on from the sign-in page.
const KEY = 'pw.signed-in';

export function hasSessionHint(): boolean {
  try {
    return globalThis.localStorage?.getItem(KEY) === '1';
  } catch {
    return true; // storage blocked: wait for the server as before
  }
}

export function setSessionHint(signedIn: boolean) {
  try {
    if (signedIn) globalThis.localStorage?.setItem(KEY, '1');
    else globalThis.localStorage?.removeItem(KEY);
  } catch {
    // storage blocked: nothing to remember
  }
}
