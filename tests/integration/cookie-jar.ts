// The cookies a server action sees in tests: set by actAs() in tests/factories.ts.
let cookie: { name: string; value: string } | null = null;

export function setSessionCookie(next: { name: string; value: string } | null) {
  cookie = next;
}

export function currentJar() {
  return {
    get: (name: string) => (cookie && cookie.name === name ? { name, value: cookie.value } : undefined),
    has: (name: string) => !!cookie && cookie.name === name,
    getAll: () => (cookie ? [cookie] : []),
  };
}
