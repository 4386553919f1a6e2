/**
 * The one way the main process answers IPC: `handle(channel, impl)`. Every message's sender frame is
 * checked (our custom scheme only), its argument is validated by the channel's validator from the shared
 * contract, and every outcome is returned as an `IpcResult` (errors in plain-data form with their code).
 * Raw `ipcMain.handle` is used nowhere else.
 */
import type { IpcMain, IpcMainInvokeEvent } from 'electron';
import { IPC_VALIDATORS, type IpcChannel, type IpcRequest, type IpcResponse, type IpcResult } from '../../shared/ipc/contract';
import { ForecatchError, serializeError } from '../../shared/errors';
import { isTrustedSenderUrl } from './trustedSender';

/** Implementation of one channel; receives the validated request. */
export type IpcImpl<C extends IpcChannel> = (request: IpcRequest<C>, event: IpcMainInvokeEvent) => Promise<IpcResponse<C>> | IpcResponse<C>;

/**
 * Checks one incoming message, without Electron: sender URL, then argument count and shape.
 * @param channel - the channel the message arrived on
 * @param senderUrl - URL of the sending frame (null when unknown)
 * @param args - the arguments after the event
 * @returns the validated request
 * @throws ForecatchError `IPC_UNTRUSTED_SENDER` for a foreign frame, `IPC_UNKNOWN_CHANNEL`, or the
 *   validator's TypeError/RangeError
 */
export function checkIpcMessage<C extends IpcChannel>(channel: C, senderUrl: string | null | undefined, args: unknown[]): IpcRequest<C> {
  if (!Object.prototype.hasOwnProperty.call(IPC_VALIDATORS, channel)) throw new ForecatchError('IPC_UNKNOWN_CHANNEL', `unknown IPC channel ${String(channel)}`);
  if (!isTrustedSenderUrl(senderUrl)) throw new ForecatchError('IPC_UNTRUSTED_SENDER', `IPC on ${channel} from an untrusted frame (${String(senderUrl)})`);
  if (args.length > 1) throw new TypeError(`${channel} takes at most one argument, got ${args.length}`);
  return IPC_VALIDATORS[channel](args[0]) as IpcRequest<C>;
}

/**
 * Runs a checked message through its implementation and wraps the outcome.
 * @returns `{ ok: true, value }` or `{ ok: false, error }`; never throws
 */
export async function runIpc<C extends IpcChannel>(
  channel: C,
  senderUrl: string | null | undefined,
  args: unknown[],
  impl: (request: IpcRequest<C>) => Promise<IpcResponse<C>> | IpcResponse<C>,
): Promise<IpcResult<IpcResponse<C>>> {
  try {
    const request = checkIpcMessage(channel, senderUrl, args);
    return { ok: true, value: await impl(request) };
  } catch (err) {
    return { ok: false, error: serializeError(err) };
  }
}

/**
 * Registers the implementation of one channel on `ipcMain` through the checks above.
 * @param ipcMain - Electron's ipcMain
 * @param channel - channel from the shared contract
 * @param impl - implementation receiving the validated request
 */
export function handle<C extends IpcChannel>(ipcMain: IpcMain, channel: C, impl: IpcImpl<C>): void {
  ipcMain.handle(channel, (event, ...args: unknown[]) =>
    runIpc(channel, event.senderFrame?.url ?? null, args, (request) => impl(request, event)),
  );
}
