// Saved jobs on this device (IndexedDB): one database with its own schema version, the upgrade
// steps that carry a store written by an older Fluxbook forward (nothing is dropped), and the
// job file and CSV written on export. Records are data only: nothing here interprets them.
//
// Store schema 1: store "jobs" (key "id"), each job {id, name, site, notes, created, updated,
//                 records: [record, ...]} with its records inside it.
// Store schema 2: "jobs" {id, name, site, notes, created, updated} and "records" (key "id",
//                 index "job") {id, job, position, calculator, title, inputs, note, saved,
//                 fluxbook_version, result}: a save writes one record, not its whole job.
// A record's fields are those of the job file (DEVELOPERS.md, "Job records"); its input names
// are brought up to date by calc.jobs (MIGRATIONS) when the jobs page rechecks it.

export const DB_NAME = "fluxbook";
export const STORE_SCHEMA = 2;
export const FILE_FORMAT = "fluxbook-job"; // = calc.jobs.FORMAT (tests/test_jobs.py holds them equal)
export const FILE_SCHEMA = 1; // = calc.jobs.SCHEMA_VERSION
export const RECORD_FIELDS = ["calculator", "title", "inputs", "note", "saved", "fluxbook_version", "result"];

// UPGRADES[n] takes the store from schema n-1 to n, inside the upgrade transaction: if any step
// fails, the whole upgrade is rolled back and the store stays as it was.
const UPGRADES = {
  1: (db) => {
    db.createObjectStore("jobs", { keyPath: "id", autoIncrement: true });
  },
  2: (db, transaction) => {
    const records = db.createObjectStore("records", { keyPath: "id", autoIncrement: true });
    records.createIndex("job", "job");
    const jobs = transaction.objectStore("jobs");
    jobs.openCursor().onsuccess = (event) => {
      const cursor = event.target.result;
      if (!cursor) return;
      const job = { ...cursor.value };
      const inside = Array.isArray(job.records) ? job.records : [];
      inside.forEach((record, position) => {
        const kept = { ...record, job: job.id, position };
        delete kept.id;
        records.add(kept);
      });
      delete job.records;
      cursor.update(job);
      cursor.continue();
    };
  },
};

function request(req) {
  return new Promise((resolve, reject) => {
    req.onsuccess = () => resolve(req.result);
    req.onerror = () => reject(req.error);
  });
}

function finished(transaction) {
  return new Promise((resolve, reject) => {
    transaction.oncomplete = () => resolve();
    transaction.onerror = () => reject(transaction.error);
    transaction.onabort = () => reject(transaction.error || new Error("the change was not stored"));
  });
}

let opening = null;

// The store, opened (and upgraded) once per visit.
export function openStore() {
  if (opening) return opening;
  opening = new Promise((resolve, reject) => {
    if (!self.indexedDB) {
      reject(new Error("this browser cannot keep data for this site (no IndexedDB; a private window may block it)"));
      return;
    }
    const req = indexedDB.open(DB_NAME, STORE_SCHEMA);
    req.onupgradeneeded = (event) => {
      for (let version = event.oldVersion + 1; version <= STORE_SCHEMA; version += 1) {
        UPGRADES[version](req.result, req.transaction);
      }
    };
    req.onsuccess = () => {
      const db = req.result;
      // A newer Fluxbook opened in another tab upgrades the store: let it, and reopen next time.
      db.onversionchange = () => { db.close(); opening = null; };
      resolve(db);
    };
    req.onerror = () => {
      const error = req.error;
      reject(error && error.name === "VersionError"
        ? new Error("the saved jobs were stored by a newer version of Fluxbook; reload the page to use it")
        : error);
    };
  });
  opening.catch(() => { opening = null; });
  return opening;
}

const byPosition = (a, b) => (a.position - b.position) || (a.id - b.id);
const newestFirst = (a, b) => String(b.updated || b.created).localeCompare(String(a.updated || a.created)) || b.id - a.id;

// Every job with its records, newest first.
export async function listJobs() {
  const db = await openStore();
  const transaction = db.transaction(["jobs", "records"]);
  const [jobs, records] = await Promise.all([
    request(transaction.objectStore("jobs").getAll()),
    request(transaction.objectStore("records").getAll()),
  ]);
  const grouped = new Map(jobs.map((job) => [job.id, { ...job, records: [] }]));
  for (const record of records) if (grouped.has(record.job)) grouped.get(record.job).records.push(record);
  const list = Array.from(grouped.values());
  for (const job of list) job.records.sort(byPosition);
  return list.sort(newestFirst);
}

export async function getJob(id) {
  return (await listJobs()).find((job) => job.id === id) || null;
}

export const sameName = (a, b) => String(a).trim().toLocaleLowerCase() === String(b).trim().toLocaleLowerCase();

// Add one record to the job of that name, or to a new job. Returns {job, record, created, count}.
export async function saveRecord({ name, site, notes }, record, now) {
  const db = await openStore();
  const transaction = db.transaction(["jobs", "records"], "readwrite");
  const jobs = transaction.objectStore("jobs");
  const records = transaction.objectStore("records");
  const all = await request(jobs.getAll());
  let job = all.filter((j) => sameName(j.name, name)).sort(newestFirst)[0];
  const created = !job;
  if (created) {
    job = { name: name.trim(), site: (site || "").trim(), notes: (notes || "").trim(), created: now, updated: now };
    job.id = await request(jobs.add(job));
  } else {
    job = { ...job, updated: now };
    if (!job.site && site) job.site = site.trim();
    jobs.put(job);
  }
  const count = await request(records.index("job").count(job.id));
  const stored = { ...pick(record), job: job.id, position: count };
  stored.id = await request(records.add(stored));
  await finished(transaction);
  return { job, record: stored, created, count: count + 1 };
}

function pick(record) {
  const kept = {};
  for (const field of RECORD_FIELDS) if (record[field] !== undefined) kept[field] = record[field];
  return kept;
}

export async function updateJob(id, changes, now) {
  const db = await openStore();
  const transaction = db.transaction("jobs", "readwrite");
  const jobs = transaction.objectStore("jobs");
  const job = await request(jobs.get(id));
  if (!job) throw new Error("that job is no longer on this device");
  jobs.put({ ...job, ...changes, updated: now });
  await finished(transaction);
}

export async function updateRecord(id, changes) {
  const db = await openStore();
  const transaction = db.transaction("records", "readwrite");
  const records = transaction.objectStore("records");
  const record = await request(records.get(id));
  if (!record) return;
  records.put({ ...record, ...changes });
  await finished(transaction);
}

// Delete a job and its records; the returned snapshot puts them back exactly (restore).
export async function deleteJob(id) {
  const db = await openStore();
  const transaction = db.transaction(["jobs", "records"], "readwrite");
  const jobs = transaction.objectStore("jobs");
  const records = transaction.objectStore("records");
  const job = await request(jobs.get(id));
  const inside = await request(records.index("job").getAll(id));
  jobs.delete(id);
  for (const record of inside) records.delete(record.id);
  await finished(transaction);
  return { jobs: job ? [job] : [], records: inside };
}

export async function deleteRecord(id) {
  const db = await openStore();
  const transaction = db.transaction("records", "readwrite");
  const records = transaction.objectStore("records");
  const record = await request(records.get(id));
  records.delete(id);
  await finished(transaction);
  return { jobs: [], records: record ? [record] : [] };
}

export async function restore(snapshot) {
  const db = await openStore();
  const transaction = db.transaction(["jobs", "records"], "readwrite");
  for (const job of snapshot.jobs) transaction.objectStore("jobs").put(job);
  for (const record of snapshot.records) transaction.objectStore("records").put(record);
  await finished(transaction);
}

// A copy of a record placed just after it, to try a variant.
export async function duplicateRecord(id, note) {
  const db = await openStore();
  const transaction = db.transaction("records", "readwrite");
  const records = transaction.objectStore("records");
  const original = await request(records.get(id));
  if (!original) throw new Error("that calculation is no longer on this device");
  const siblings = (await request(records.index("job").getAll(original.job))).sort(byPosition);
  let position = 0;
  let copyPosition = 0;
  for (const record of siblings) {
    if (record.position !== position) records.put({ ...record, position });
    position += 1;
    if (record.id === original.id) { copyPosition = position; position += 1; }
  }
  const copy = { ...pick(original), note, job: original.job, position: copyPosition };
  copy.id = await request(records.add(copy));
  await finished(transaction);
  return copy;
}

const recordKey = (r) => JSON.stringify([r.calculator, r.inputs, r.note || "", r.saved || ""]);

// Store a checked job (from calc.jobs check_job) in one transaction: all of it or nothing.
// mode "new": a job of its own (named `name`); "merge": its records added to job `into`,
// leaving out any the job already holds. Returns {job, added, skipped}.
export async function importJob(checked, { mode, name, into }, now) {
  const db = await openStore();
  const transaction = db.transaction(["jobs", "records"], "readwrite");
  const jobs = transaction.objectStore("jobs");
  const records = transaction.objectStore("records");
  let job;
  let existing = [];
  if (mode === "merge") {
    job = await request(jobs.get(into));
    if (!job) throw new Error("the job to add to is no longer on this device");
    existing = await request(records.index("job").getAll(into));
    job = { ...job, updated: now };
    jobs.put(job);
  } else {
    job = {
      name, site: checked.site || "", notes: checked.notes || "",
      created: checked.created || now, updated: now,
    };
    job.id = await request(jobs.add(job));
  }
  const seen = new Set(existing.map(recordKey));
  let position = existing.length;
  let added = 0;
  for (const record of checked.records) {
    if (seen.has(recordKey(record))) continue;
    seen.add(recordKey(record));
    records.add({ ...pick(record), job: job.id, position });
    position += 1;
    added += 1;
  }
  await finished(transaction);
  return { job, added, skipped: checked.records.length - added };
}

// The job file: our own format, documented in DEVELOPERS.md ("Job records").
export function jobFile(job, fluxbookVersion, now) {
  return {
    format: FILE_FORMAT,
    schema: FILE_SCHEMA,
    fluxbook_version: fluxbookVersion,
    exported: now,
    job: {
      name: job.name,
      site: job.site || "",
      notes: job.notes || "",
      created: job.created || "",
      updated: job.updated || "",
      records: job.records.map(pick),
    },
  };
}

// A spreadsheet cell: quoted, and text that a spreadsheet would run as a formula made inert.
function cell(value) {
  let text = value === null || value === undefined ? "" : String(value);
  if (typeof value !== "number" && /^[=+\-@\t\r]/.test(text)) text = "'" + text;
  return `"${text.replace(/"/g, '""')}"`;
}

const CSV_HEADER = ["job", "site", "record", "calculator", "note", "saved", "fluxbook_version",
  "result", "shown", "value", "unit", "verdict"];

// One row per saved output: the key results of every record, for a spreadsheet.
export function jobCsv(job, verdictOf) {
  const rows = [CSV_HEADER];
  job.records.forEach((record, index) => {
    const result = record.result || { outputs: {}, checks: [] };
    const verdict = verdictOf(result.checks || []);
    for (const output of Object.values(result.outputs || {})) {
      rows.push([job.name, job.site || "", index + 1, record.calculator, record.note || "",
        record.saved || "", record.fluxbook_version || "", output.label, output.display,
        typeof output.value === "number" ? output.value : String(output.value), output.unit, verdict]);
    }
  });
  return rows.map((row) => row.map(cell).join(",")).join("\r\n") + "\r\n";
}
