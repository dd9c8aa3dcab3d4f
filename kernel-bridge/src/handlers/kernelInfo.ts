/** kernel_info_request (shell and control): who we are, what language the cells speak. */
import { PROTOCOL_VERSION } from '../messageFactory';
import { sessionFailure, type Handler } from './context';

export const kernelInfo: Handler = async (ctx) => {
  let languageInfo: Record<string, unknown>;
  let banner: string;
  try {
    languageInfo = { ...ctx.session.languageInfo() };
    banner = ctx.session.banner();
  } catch (err) {
    ctx.log(`kernel_info: session failed: ${String(err)}`);
    await ctx.reply('kernel_info_reply', { ...sessionFailure(err), protocol_version: PROTOCOL_VERSION });
    return;
  }
  await ctx.reply('kernel_info_reply', {
    status: 'ok',
    protocol_version: PROTOCOL_VERSION,
    implementation: ctx.identity.implementation,
    implementation_version: ctx.identity.implementationVersion,
    language_info: languageInfo,
    banner,
    help_links: ctx.identity.helpLinks,
    debugger: false,
  });
};
