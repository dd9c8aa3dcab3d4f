/** inspect_request: documentation for what is under the cursor (field docs and units, cell kinds). */
import { codePointLength, codePointsToIndex } from '../cursor';
import { invalidRequest, sessionFailure, type Handler } from './context';

export const inspect: Handler = async (ctx) => {
  const { code, cursor_pos: cursorPos, detail_level: detailLevel } = ctx.request.content;
  if (typeof code !== 'string') {
    await ctx.reply('inspect_reply', invalidRequest('code', 'a string', code));
    return;
  }
  const length = codePointLength(code);
  const pos = typeof cursorPos === 'number' && Number.isInteger(cursorPos) && cursorPos >= 0 ? Math.min(cursorPos, length) : length;
  try {
    const answer = ctx.session.inspect(code, codePointsToIndex(code, pos), detailLevel === 1 ? 1 : 0);
    await ctx.reply('inspect_reply', { status: 'ok', found: answer.found, data: answer.found ? answer.data : {}, metadata: {} });
  } catch (err) {
    ctx.log(`inspect: session failed: ${String(err)}`);
    await ctx.reply('inspect_reply', sessionFailure(err));
  }
};
