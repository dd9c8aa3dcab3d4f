/** The handler table: msg_type → handler. Anything not listed is logged and answered with busy/idle only. */
import type { Handler } from './context';
import { kernelInfo } from './kernelInfo';
import { execute } from './execute';
import { isComplete } from './isComplete';
import { complete } from './complete';
import { inspect } from './inspect';
import { history } from './history';
import { commOpen, commMsg, commClose, commInfo } from './comms';
import { interrupt, shutdown } from './control';

export const SHELL_HANDLERS: Readonly<Record<string, Handler>> = {
  kernel_info_request: kernelInfo,
  execute_request: execute,
  is_complete_request: isComplete,
  complete_request: complete,
  inspect_request: inspect,
  history_request: history,
  comm_open: commOpen,
  comm_msg: commMsg,
  comm_close: commClose,
  comm_info_request: commInfo,
  interrupt_request: interrupt,
  shutdown_request: shutdown,
};

/** Control serves what must not wait behind a running execute. */
export const CONTROL_HANDLERS: Readonly<Record<string, Handler>> = {
  kernel_info_request: kernelInfo,
  interrupt_request: interrupt,
  shutdown_request: shutdown,
  comm_info_request: commInfo,
  is_complete_request: isComplete,
  complete_request: complete,
  inspect_request: inspect,
  history_request: history,
};

export type { Handler, HandlerContext, KernelState, KernelIdentity, Channel } from './context';
