/** interrupt_request and shutdown_request (normally on control, accepted on shell too). */
import type { Handler } from './context';

export const interrupt: Handler = async (ctx) => {
  ctx.interrupt();
  await ctx.reply('interrupt_reply', { status: 'ok' });
};

/**
 * The host process exits after the reply and idle (the kernel manager starts a fresh process for a restart);
 * with `restart` the session and kernel state are reset first, which is what an in-process host relies on.
 */
export const shutdown: Handler = async (ctx) => {
  const restart = ctx.request.content.restart === true;
  ctx.interrupt();
  ctx.requestShutdown(restart);
  const content = { status: 'ok', restart };
  await ctx.reply('shutdown_reply', content);
  // Other clients learn about the shutdown from IOPub.
  ctx.publish('shutdown_reply', content);
};
