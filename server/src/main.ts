// Language server entry, bundled to server/dist/server.mjs. Transport from the arguments: --stdio or --node-ipc.
import { startDetentLanguageServer } from '../../packages/language/src/lsp/start-server.js';

startDetentLanguageServer();
