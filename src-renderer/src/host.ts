import {
  bridgeGlobal,
  HostError,
  type Channel,
  type ChannelInput,
  type ChannelOutput,
  type HostBridge,
  type HostCommand,
  type HostReply,
  type JobProgress,
} from '@shared/host/contract';

/** The page's only way to the host: typed calls over the bridge that preload (or a test) installed. */
function bridge(): HostBridge {
  const b = (globalThis as unknown as Record<string, HostBridge | undefined>)[bridgeGlobal];
  if (!b) throw new HostError('NoHost', 'Tallywise is running without its host; start it as the desktop app.');
  return b;
}

export async function call<C extends Channel>(channel: C, input: ChannelInput<C>): Promise<ChannelOutput<C>> {
  const fn = bridge()[channel] as (arg: ChannelInput<C>) => Promise<HostReply<ChannelOutput<C>>>;
  const reply = await fn(input);
  if (reply.ok) return reply.value;
  throw new HostError(reply.error.name, reply.error.message, reply.error.code);
}

export function onHostCommand(listener: (command: HostCommand) => void): () => void {
  return bridge().onCommand(listener);
}

/** Progress events of the host's long jobs (each names its job); returns the unsubscribe. */
export function onHostProgress(listener: (progress: JobProgress) => void): () => void {
  return bridge().onProgress(listener);
}
