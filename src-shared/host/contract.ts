import { z } from 'zod';
import { channelNames, type ChannelName, type HostCommand } from './channels';

export { bridgeGlobal, commandChannel, hostCommands, type HostCommand } from './channels';

/**
 * The host contract: every call the renderer can make of the main process,
 * as one map from channel name (`domain:verb`) to the schema of its argument
 * and the type of its result. Main registers one handler per channel from
 * service objects, preload exposes one function per channel and nothing
 * else, and the renderer calls them through a typed client.
 */

export const programmeOverviewSchema = z.object({
  programme: z.string(),
  description: z.string(),
  sites: z.array(z.object({ name: z.string(), habitat: z.string(), areaM2: z.number(), seasonsSurveyed: z.number() })),
  seasons: z.array(z.object({ season: z.number(), visits: z.number(), sites: z.number() })),
  species: z.array(z.object({ name: z.string(), total: z.number(), sitesPresent: z.number() })),
  sourceFiles: z.array(z.string()),
  records: z.number(),
});
export type ProgrammeOverview = z.infer<typeof programmeOverviewSchema>;

export const appInfoSchema = z.object({ name: z.string(), version: z.string(), platform: z.string() });
export type AppInfo = z.infer<typeof appInfoSchema>;

const empty = z.object({}).strict();
const filePath = z.string().min(1, 'a file path is needed');

/** Channel name → argument schema and result type. */
export const hostContract = {
  'app:info': { input: empty, output: appInfoSchema },
  'demo:overview': { input: empty, output: programmeOverviewSchema },
  'dialog:choose-open': {
    input: z.object({ title: z.string(), extensions: z.array(z.string()) }).strict(),
    output: z.object({ path: z.string().nullable() }),
  },
  'dialog:choose-save': {
    input: z.object({ title: z.string(), defaultName: z.string(), extensions: z.array(z.string()) }).strict(),
    output: z.object({ path: z.string().nullable() }),
  },
  'file:reveal': { input: z.object({ path: filePath }).strict(), output: z.object({ ok: z.boolean() }) },
} as const satisfies Record<ChannelName, { input: z.ZodType; output: z.ZodType }>;

// Both ways: every listed channel has a schema (above) and every schema is listed (here).
type Unlisted = Exclude<keyof typeof hostContract, ChannelName>;
const allListed: Unlisted extends never ? true : never = true;
void allListed;

export type HostContract = typeof hostContract;
export type Channel = keyof HostContract;
export type ChannelInput<C extends Channel> = z.input<HostContract[C]['input']>;
export type ChannelOutput<C extends Channel> = z.output<HostContract[C]['output']>;

export const channels: readonly Channel[] = channelNames;

/** An error as it crosses the bridge: a stable name the UI can branch on, and a plain message. */
export interface HostErrorShape {
  name: string;
  message: string;
}

/** What every handler answers: a value, or an error shape (never a thrown object across the bridge). */
export type HostReply<T> = { ok: true; value: T } | { ok: false; error: HostErrorShape };

export class HostError extends Error {
  constructor(name: string, message: string) {
    super(message);
    this.name = name;
  }
}

/** Service implementations: one async function per channel. */
export type HostServices = { [C in Channel]: (input: z.output<HostContract[C]['input']>) => Promise<ChannelOutput<C>> };

/** The object preload exposes (and the browser tests install): one function per channel. */
export type HostBridge = {
  [C in Channel]: (input: ChannelInput<C>) => Promise<HostReply<ChannelOutput<C>>>;
} & { onCommand(listener: (command: HostCommand) => void): () => void };
