// Arrange threads start here: plain JavaScript that registers the TypeScript loader (tsx), then
// loads the real task. Threads are started with empty execArgv, so this is the only loader.
import { register } from 'tsx/esm/api';

register();
const { arrangeTask } = await import('./thread.ts');

export default arrangeTask;
