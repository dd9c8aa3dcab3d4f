/** complete_request: completions at the cursor (positions in code points on the wire, see cursor.ts). */
import { codePointLength, codePointsToIndex, indexToCodePoints } from '../cursor';
import { invalidRequest, sessionFailure, type Handler } from './context';

export const complete: Handler = async (ctx) => {
  const { code, cursor_pos: cursorPos } = ctx.request.content;
  if (typeof code !== 'string') {
    await ctx.reply('complete_reply', invalidRequest('code', 'a string', code));
    return;
  }
  const length = codePointLength(code);
  const pos = typeof cursorPos === 'number' && Number.isInteger(cursorPos) && cursorPos >= 0 ? Math.min(cursorPos, length) : length;
  try {
    const answer = ctx.session.complete(code, codePointsToIndex(code, pos));
    await ctx.reply('complete_reply', {
      status: 'ok',
      matches: answer.matches,
      cursor_start: indexToCodePoints(code, answer.cursorStart),
      cursor_end: indexToCodePoints(code, answer.cursorEnd),
      metadata: answer.metadata ?? {},
    });
  } catch (err) {
    ctx.log(`complete: session failed: ${String(err)}`);
    await ctx.reply('complete_reply', sessionFailure(err));
  }
};
