// Undo and redo of job edits: the job as JSON text after each edit, up to LIMIT steps back.
const LIMIT = 100;

export function makeHistory(onState = () => {}) {
  let undo = [];
  let redo = [];
  let now = null;
  const tell = () => onState({ canUndo: undo.length > 0, canRedo: redo.length > 0 });
  return {
    reset(job) { undo = []; redo = []; now = JSON.stringify(job); tell(); },
    // after an edit: the state before it goes on the undo stack (no step when nothing changed)
    record(job) {
      const text = JSON.stringify(job);
      if (text === now) return;
      if (now !== null) undo.push(now);
      if (undo.length > LIMIT) undo.shift();
      now = text;
      redo = [];
      tell();
    },
    undo() {
      if (!undo.length) return null;
      redo.push(now);
      now = undo.pop();
      tell();
      return JSON.parse(now);
    },
    redo() {
      if (!redo.length) return null;
      undo.push(now);
      now = redo.pop();
      tell();
      return JSON.parse(now);
    },
  };
}
