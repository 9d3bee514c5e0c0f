// The jobs kept in this browser: a list (name, date changed) and one autosave per job, in
// localStorage. A tab remembers which job it has open (sessionStorage), so two tabs can work on
// two jobs; when another tab saves the job this tab has open, `watchOtherTabs` reports it and the
// page asks which version to keep (the storage event fires only in the other tabs).
const INDEX_KEY = "linesmith.jobs.v1";
const JOB_PREFIX = "linesmith.jobs.v1.job.";
const OLD_KEY = "linesmith.job.v1"; // the single autosave of earlier versions
const OPEN_KEY = "linesmith.open";  // per tab (sessionStorage), and the last one opened (localStorage)
const TAB = Math.random().toString(36).slice(2) + Date.now().toString(36);

const read = (key) => { try { return JSON.parse(localStorage.getItem(key)); } catch { return null; } };
const write = (key, value) => { try { localStorage.setItem(key, JSON.stringify(value)); return true; } catch { return false; } };

export function listJobs() {
  const index = read(INDEX_KEY);
  return Array.isArray(index) ? [...index].sort((a, b) => (b.changed || "").localeCompare(a.changed || "")) : [];
}

function putIndex(id, name) {
  const index = listJobs().filter((e) => e.id !== id);
  index.push({ id, name: name || "(unnamed)", changed: new Date().toISOString() });
  return write(INDEX_KEY, index);
}

export function saveJob(id, job) {
  return write(JOB_PREFIX + id, { tab: TAB, job }) && putIndex(id, job.name);
}

export function createJob(job) {
  const id = `j${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
  return saveJob(id, job) ? id : null;
}

export function readJob(id) {
  const rec = read(JOB_PREFIX + id);
  const job = rec && rec.job;
  return job && typeof job === "object" && !Array.isArray(job) ? job : null;
}

export function deleteJob(id) {
  try { localStorage.removeItem(JOB_PREFIX + id); } catch { /* private mode */ }
  return write(INDEX_KEY, listJobs().filter((e) => e.id !== id));
}

export function duplicateJob(id) {
  const job = readJob(id);
  return job ? createJob({ ...job, name: `${job.name || "job"} (copy)` }) : null;
}

// The job this tab has open: its own, else the last one opened anywhere, else null.
export function openId() {
  let id = null;
  try { id = sessionStorage.getItem(OPEN_KEY) || localStorage.getItem(OPEN_KEY); } catch { /* private mode */ }
  return id && readJob(id) ? id : null;
}

export function setOpen(id) {
  try { sessionStorage.setItem(OPEN_KEY, id); localStorage.setItem(OPEN_KEY, id); } catch { /* private mode */ }
}

// The single autosave of earlier versions joins the list once; it is removed only after the copy
// is written, so nothing is lost. Returns the new job's id, or null.
export function migrateOldAutosave() {
  let text = null;
  try { text = localStorage.getItem(OLD_KEY); } catch { return null; }
  if (!text) return null;
  let job = null;
  try { job = JSON.parse(text); } catch { return null; }
  if (!job || typeof job !== "object" || Array.isArray(job)) return null;
  const id = createJob(job);
  if (id) { try { localStorage.removeItem(OLD_KEY); } catch { /* kept: nothing lost */ } }
  return id;
}

export function watchOtherTabs(currentId, onForeignSave) {
  window.addEventListener("storage", (event) => {
    if (!event.key || event.key !== JOB_PREFIX + currentId() || !event.newValue) return;
    let rec = null;
    try { rec = JSON.parse(event.newValue); } catch { return; }
    if (rec && rec.tab !== TAB && rec.job) onForeignSave(rec.job);
  });
}

// One backup file of every job: {"linesmith_backup": 1, "jobs": [{name, changed, job}]}.
export function backup() {
  const jobs = listJobs().map((e) => ({ name: e.name, changed: e.changed, job: readJob(e.id) })).filter((e) => e.job);
  return { linesmith_backup: 1, saved: new Date().toISOString(), jobs };
}

export function backupJobs(data) {
  if (!data || data.linesmith_backup !== 1 || !Array.isArray(data.jobs)) return null;
  return data.jobs.filter((e) => e && e.job && typeof e.job === "object" && !Array.isArray(e.job)).map((e) => e.job);
}
