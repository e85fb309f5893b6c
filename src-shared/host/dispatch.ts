import { hostContract, type Channel, type HostReply, type HostServices } from './contract';

/**
 * Runs one call against the services: validates the argument with the
 * channel's schema, calls the service, and turns any failure into an error
 * shape. Electron's IPC handlers and the browser-test bridge both use this,
 * so the two differ only in transport.
 */
export async function dispatchHostCall(services: HostServices, channel: string, input: unknown): Promise<HostReply<unknown>> {
  if (!Object.prototype.hasOwnProperty.call(hostContract, channel)) {
    return { ok: false, error: { name: 'UnknownChannel', message: `There is no host call named "${channel}".` } };
  }
  const ch = channel as Channel;
  const parsed = hostContract[ch].input.safeParse(input ?? {});
  if (!parsed.success) {
    const detail = parsed.error.issues.map((i) => `${i.path.join('.') || 'argument'}: ${i.message}`).join('; ');
    return { ok: false, error: { name: 'InvalidArgument', message: `The call "${channel}" got a bad argument (${detail}).` } };
  }
  try {
    const service = services[ch] as (arg: unknown) => Promise<unknown>;
    const value = await service(parsed.data);
    return { ok: true, value };
  } catch (err) {
    const e = err as { name?: unknown; message?: unknown; code?: unknown };
    const name = typeof e?.name === 'string' && e.name !== 'Error' ? e.name : 'HostFailure';
    const message = typeof e?.message === 'string' && e.message ? e.message : String(err);
    return { ok: false, error: typeof e?.code === 'string' ? { name, message, code: e.code } : { name, message } };
  }
}
