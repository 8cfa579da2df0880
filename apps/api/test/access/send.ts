import type { AccessEntry, Agent, Prepared } from './types';

/** Fills the route's :params from `vars`, failing loudly when one has no value. */
export function urlOf(route: string, vars: Record<string, string>): { method: string; url: string } {
  const [method, template] = route.split(' ') as [string, string];
  const url = template.replace(/:(\w+)/g, (_, name: string) => {
    if (!(name in vars))
      throw new Error(
        `${route}: the access entry gives no value for :${name} (return it from prepare as vars.${name})`,
      );
    return encodeURIComponent(vars[name]!);
  });
  return { method, url };
}

/** Sends one request the way an access entry describes it. */
export async function send(agent: Agent, method: string, url: string, prepared: Prepared, entry?: AccessEntry) {
  let call = agent[method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete'](url);
  if (prepared.query) call = call.query(prepared.query);
  if (prepared.attach) {
    for (const [k, v] of Object.entries(prepared.attach.fields ?? {})) call = call.field(k, v);
    return call.attach(prepared.attach.field, prepared.attach.file, prepared.attach.filename);
  }
  const body = prepared.body ?? entry?.body;
  return body !== undefined ? call.send(body as object) : call;
}
