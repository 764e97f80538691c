/** Module-resolution hook (Node module customization hooks): 'electron' → the fake. */
let fakeUrl;

export function initialize(data) {
  fakeUrl = data.fakeUrl;
}

export async function resolve(specifier, context, nextResolve) {
  if (specifier === 'electron') return { url: fakeUrl, shortCircuit: true };
  return nextResolve(specifier, context);
}
