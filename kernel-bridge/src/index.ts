/** The Multiplet Jupyter kernel: wire protocol over ZeroMQ, signing, handlers, comms, interrupts. */
export { startKernel, KERNEL_IDENTITY, type RunningKernel, type StartKernelOptions } from './kernel';
export { KernelRouter, type RouterOptions, type SocketName } from './router';
export { createSigner, ReplayGuard, SignatureSchemeError, type Signer } from './signing';
export { decodeMessage, encodeMessage, splitFrames, DELIMITER, type JupyterMessage, type ReceivedMessage, type MessageHeader } from './wire';
export { createMessageFactory, PROTOCOL_VERSION, type MessageFactory } from './messageFactory';
export { parseConnectionInfo, readConnectionFile, endpoint, ConnectionFileError, type ConnectionInfo } from './connection';
export {
  buildKernelSpec,
  installKernelSpec,
  kernelSpecDir,
  userDataDir,
  DEFAULT_KERNEL_NAME,
  KernelNameError,
  type KernelSpec,
  type InstallTarget,
} from './kernelspec';
