/** Chooses the host at startup: the Electron bridge when the preload exposed it, else the browser host. */
import type { ForecatchBridge } from '../../../shared/ipc/contract';
import { createBrowserHost } from './browserHost';
import { createElectronHost } from './electronHost';
import type { Host } from './host';

/** @returns the Electron host inside the desktop shell, the browser host anywhere else */
export function pickHost(): Host {
  const bridge = (window as unknown as { forecatch?: ForecatchBridge }).forecatch;
  return bridge && typeof bridge.openStudy === 'function' ? createElectronHost(bridge) : createBrowserHost();
}
