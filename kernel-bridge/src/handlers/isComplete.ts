/** is_complete_request: whether the console should run the text or wait for more lines. */
import { invalidRequest, sessionFailure, type Handler } from './context';

export const isComplete: Handler = async (ctx) => {
  const code = ctx.request.content.code;
  if (typeof code !== 'string') {
    await ctx.reply('is_complete_reply', { ...invalidRequest('code', 'a string', code), status: 'unknown' });
    return;
  }
  try {
    const answer = ctx.session.isComplete(code);
    const content: Record<string, unknown> = { status: answer.status };
    if (answer.status === 'incomplete') content.indent = answer.indent ?? '';
    await ctx.reply('is_complete_reply', content);
  } catch (err) {
    ctx.log(`is_complete: session failed: ${String(err)}`);
    // is_complete_reply has no error form: "unknown" is the protocol's answer for "cannot tell".
    await ctx.reply('is_complete_reply', { status: 'unknown', error: sessionFailure(err).evalue });
  }
};
