/** A batch worker thread: builds and writes the briefs it is handed, keeping each job's data loaded. */
import { type BatchTask, runTask, type TaskResult } from './batch.js';

export default function work(task: BatchTask): Promise<TaskResult> {
  return runTask(task);
}
