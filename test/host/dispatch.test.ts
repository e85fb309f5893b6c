import { describe, expect, it } from 'vitest';
import { channels, hostContract, type HostServices } from '@shared/host/contract';
import { channelNames } from '@shared/host/channels';
import { dispatchHostCall } from '@shared/host/dispatch';
import { createHostServices } from '../../src-main/services/host-services';

const services: HostServices = createHostServices({
  appName: 'Tallywise',
  appVersion: '1.2.3',
  platform: 'linux',
  userDataDir: '/nonexistent',
  dialogs: { chooseOpen: async () => '/tmp/a.xlsx', chooseSave: async () => null },
  shell: {
    reveal: async (p) => {
      if (p === '/boom') throw Object.assign(new Error('The folder /boom is gone.'), { name: 'NotFound' });
      if (p === '/coded') throw Object.assign(new Error('The project file is damaged.'), { name: 'ProjectFileError', code: 'damaged' });
      return true;
    },
  },
});

describe('host dispatch', () => {
  it('the channel list and the schema map agree', () => {
    expect([...channels].sort()).toEqual(Object.keys(hostContract).sort());
    expect(channels).toEqual(channelNames);
    for (const c of channels) expect(c).toMatch(/^[a-z]+:[a-z-]+$/);
  });
  it('answers a valid call with its value', async () => {
    await expect(dispatchHostCall(services, 'app:info', {})).resolves.toEqual({ ok: true, value: { name: 'Tallywise', version: '1.2.3', platform: 'linux' } });
    await expect(dispatchHostCall(services, 'dialog:choose-open', { title: 'Open', extensions: ['xlsx'] })).resolves.toEqual({ ok: true, value: { path: '/tmp/a.xlsx' } });
  });
  it('refuses unknown channels and bad arguments with stable names', async () => {
    const unknown = await dispatchHostCall(services, 'fs:rm', {});
    expect(unknown).toMatchObject({ ok: false, error: { name: 'UnknownChannel' } });
    const proto = await dispatchHostCall(services, 'toString', {});
    expect(proto).toMatchObject({ ok: false, error: { name: 'UnknownChannel' } });
    const bad = await dispatchHostCall(services, 'dialog:choose-open', { title: 3 });
    expect(bad).toMatchObject({ ok: false, error: { name: 'InvalidArgument' } });
    const extra = await dispatchHostCall(services, 'app:info', { sneaky: true });
    expect(extra).toMatchObject({ ok: false, error: { name: 'InvalidArgument' } });
  });
  it('turns a service failure into { name, message }', async () => {
    const r = await dispatchHostCall(services, 'file:reveal', { path: '/boom' });
    expect(r).toEqual({ ok: false, error: { name: 'NotFound', message: 'The folder /boom is gone.' } });
    const coded = await dispatchHostCall(services, 'file:reveal', { path: '/coded' });
    expect(coded).toEqual({ ok: false, error: { name: 'ProjectFileError', message: 'The project file is damaged.', code: 'damaged' } });
  });
});
