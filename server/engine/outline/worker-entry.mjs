// Pool threads start here: plain JavaScript that registers the TypeScript loader (tsx), then
// loads the real worker. Workers are started with empty execArgv, so this is the only loader.
import { register } from 'tsx/esm/api';

register();
const { outlineTask } = await import('./worker.ts');

export default outlineTask;
