/**
 * comm_open, comm_msg, comm_close and comm_info_request. The session decides which targets it answers
 * (`commTargets`) and what a comm does (`openComm`); what it sends back through its `CommHost` goes out on IOPub
 * as comm_msg, parented to the latest request on that comm.
 */
import type { CellOutput } from '@multiplet/cells/protocol';
import { invalidRequest, sessionFailure, type Handler } from './context';

export const commOpen: Handler = async (ctx) => {
  const { comm_id: commId, target_name: targetName, data } = ctx.request.content;
  if (typeof commId !== 'string' || typeof targetName !== 'string') {
    ctx.log(`comm_open: needs string comm_id and target_name, got ${JSON.stringify([commId, targetName])}`);
    return;
  }
  if (ctx.state.comms.has(commId)) {
    ctx.log(`comm_open: comm ${commId} is already open; ignored`);
    return;
  }
  const refuse = (why: string) => {
    ctx.log(`comm_open: ${why}; closing ${commId}`);
    // The protocol's answer to a comm the kernel will not take: an immediate comm_close.
    ctx.publish('comm_close', { comm_id: commId, data: {} });
  };
  let targets: string[];
  try {
    targets = ctx.session.commTargets();
  } catch (err) {
    refuse(`session failed listing comm targets: ${sessionFailure(err).evalue}`);
    return;
  }
  if (!targets.includes(targetName)) {
    refuse(`no comm target "${targetName}" (known: ${targets.join(', ') || 'none'})`);
    return;
  }
  const registry = ctx.state.comms;
  const publish = ctx.publish;
  const log = ctx.log;
  const currentShellParent = ctx.currentShellParent;
  const host = {
    send(payload: unknown) {
      const comm = registry.get(commId);
      if (!comm) {
        log(`comm ${commId}: the session sent on a closed comm; dropped`);
        return;
      }
      // Parented like the kernel's other output: to the request being handled (an execute that pushed a state
      // snapshot, a comm_msg that asked for one), else to the latest request on this comm.
      void publish('comm_msg', { comm_id: commId, data: payload ?? {} }, currentShellParent() ?? comm.parent);
    },
  };
  let handler;
  try {
    handler = ctx.session.openComm(targetName, commId, data ?? {}, host);
  } catch (err) {
    refuse(`session failed opening the comm: ${sessionFailure(err).evalue}`);
    return;
  }
  if (!handler) {
    refuse(`the session refused target "${targetName}"`);
    return;
  }
  registry.add({ commId, targetName, handler, parent: ctx.request.header });
};

export const commMsg: Handler = async (ctx) => {
  const { comm_id: commId, data } = ctx.request.content;
  const comm = typeof commId === 'string' ? ctx.state.comms.get(commId) : undefined;
  if (!comm) {
    ctx.log(`comm_msg: no open comm ${JSON.stringify(commId)}; ignored`);
    return;
  }
  comm.parent = ctx.request.header;
  let finished = false;
  const emit = (output: CellOutput) => {
    if (finished) ctx.log(`comm ${comm.commId}: dropped a ${output.type} output emitted after the handler finished`);
    else ctx.publishOutput(output);
  };
  try {
    await ctx.cancellable((cancelFlag) => comm.handler.onMessage(data ?? {}, { emit, cancelFlag }));
  } catch (err) {
    ctx.log(`comm ${comm.commId}: handler failed: ${sessionFailure(err).evalue}`);
  }
  finished = true;
};

export const commClose: Handler = async (ctx) => {
  const commId = ctx.request.content.comm_id;
  const comm = typeof commId === 'string' ? ctx.state.comms.remove(commId) : undefined;
  if (!comm) {
    ctx.log(`comm_close: no open comm ${JSON.stringify(commId)}; ignored`);
    return;
  }
  try {
    comm.handler.onClose();
  } catch (err) {
    ctx.log(`comm ${comm.commId}: close handler failed: ${sessionFailure(err).evalue}`);
  }
};

export const commInfo: Handler = async (ctx) => {
  const target = ctx.request.content.target_name;
  if (target !== undefined && target !== null && typeof target !== 'string') {
    await ctx.reply('comm_info_reply', { ...invalidRequest('target_name', 'a string', target), comms: {} });
    return;
  }
  await ctx.reply('comm_info_reply', { status: 'ok', comms: ctx.state.comms.info(typeof target === 'string' ? target : undefined) });
};
