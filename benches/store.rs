//! `cargo bench --bench store`: the file store against SQLite on the same workload.
//!
//! 2,000 tags and 100,000 entries spread over a year. Rows: open the store (ready to
//! list tags), open it and run a first text search (so the log itself is read: loopside
//! reads a snapshot's entries only when first needed), append one durable entry, a
//! case-insensitive text search, and a CSV export of one week. SQLite runs in WAL mode with synchronous=FULL (the same durability: an
//! append is on disk when the call returns), tags stored as JSON text, entries as
//! columns with indexes on time and tag. Each figure is the median of several runs.
//! Targets (issue 3): open ≤ 150 ms, search ≤ 20 ms, loopside/SQLite ≤ 1.0 for open and
//! search, ≤ 1.5 for the durable append.

use chrono::{DateTime, Duration, FixedOffset, TimeZone, Utc};
use loopside::journal::{Entry, EntryId, Kind, Query, TagId};
use loopside::report::{self, Bundle};
use loopside::scale::Scale;
use loopside::store::{FileStore, Store, TagRecord};
use loopside::tag::Tag;
use rusqlite::{params, Connection};
use std::path::{Path, PathBuf};
use std::time::Instant;

const TAGS: usize = 2_000;
const ENTRIES: usize = 100_000;
const PREFIXES: [&str; 7] = ["LT", "PT", "FT", "TT", "AT", "PDT", "FIC"];
const WORDS: [&str; 12] = [
    "reading steady",
    "matches the local gauge",
    "zero checked",
    "span trimmed",
    "loose terminal re-made",
    "cable gland tightened",
    "condensate drained",
    "as found within tolerance",
    "fuse replaced in the marshalling cabinet",
    "operators informed",
    "no action",
    "shield earthed at one end only",
];
/// The word searched for; it appears in about 1 % of entries.
const NEEDLE: &str = "IMPULSE LINE";

struct Rng(u64);
impl Rng {
    fn next(&mut self) -> u64 {
        self.0 ^= self.0 << 13;
        self.0 ^= self.0 >> 7;
        self.0 ^= self.0 << 17;
        self.0
    }
    fn below(&mut self, n: usize) -> usize {
        (self.next() % n as u64) as usize
    }
}

fn start() -> DateTime<FixedOffset> {
    FixedOffset::east_opt(3600)
        .and_then(|o| o.with_ymd_and_hms(2025, 12, 1, 6, 0, 0).single())
        .expect("valid start time")
}

fn workload() -> Bundle {
    let mut rng = Rng(0x9e37_79b9_7f4a_7c15);
    let tags: Vec<TagRecord> = (0..TAGS)
        .map(|i| {
            let number = format!("{}-{}", PREFIXES[i % PREFIXES.len()], 1000 + i);
            let mut tag =
                Tag::new(&number, Scale::linear(0.0, 10.0, "bar").expect("scale")).expect("tag");
            tag.service = format!("Demo service {i}");
            tag.area = format!("Area {}", i % 40);
            TagRecord {
                id: TagId(format!("tag-{i:06}")),
                tag,
            }
        })
        .collect();
    let t0 = start();
    let step = 365.0 * 86_400.0 / ENTRIES as f64;
    let entries = (0..ENTRIES)
        .map(|i| {
            let time = t0 + Duration::milliseconds((i as f64 * step * 1000.0) as i64);
            let tag = &tags[rng.below(TAGS)];
            let mut text = format!(
                "{}: {:.2} mA, {}; {}.",
                tag.tag.number,
                4.0 + rng.below(1600) as f64 / 100.0,
                WORDS[rng.below(WORDS.len())],
                WORDS[rng.below(WORDS.len())]
            );
            if rng.below(100) == 0 {
                text.push_str(" Impulse line partly blocked, blown through.");
            }
            let kind = Kind::ALL[rng.below(Kind::ALL.len())];
            let mut e = Entry::new(&tag.id, time, "AB", kind, &text).expect("entry");
            if rng.below(5) == 0 {
                e.payload = Some(serde_json::json!({
                    "measured_ma": 4.0 + rng.below(1600) as f64 / 100.0,
                    "points": [4.01, 8.02, 12.0, 15.99, 20.01]
                }));
            }
            e
        })
        .collect();
    Bundle {
        loopside: "bundle".into(),
        schema: report::BUNDLE_SCHEMA,
        exported: t0,
        since: None,
        until: None,
        tags,
        entries,
        references: Vec::new(),
    }
}

fn median(mut v: Vec<f64>) -> f64 {
    v.sort_by(f64::total_cmp);
    v[v.len() / 2]
}

fn time_ms<T>(runs: usize, mut f: impl FnMut() -> T) -> f64 {
    median(
        (0..runs)
            .map(|_| {
                let t = Instant::now();
                std::hint::black_box(f());
                t.elapsed().as_secs_f64() * 1000.0
            })
            .collect(),
    )
}

fn week() -> (DateTime<Utc>, DateTime<Utc>) {
    let a = (start() + Duration::days(180)).with_timezone(&Utc);
    (a, a + Duration::days(7))
}

fn new_entry(tag: &TagId) -> Entry {
    Entry::new(
        tag,
        chrono::Local::now().fixed_offset(),
        "CD",
        Kind::Finding,
        "3.2 mA at the marshalling terminals; loose wire re-made",
    )
    .expect("entry")
}

struct Row {
    name: &'static str,
    ours: f64,
    sqlite: f64,
    target: &'static str,
}

fn bench_loopside(dir: &Path, bundle: &Bundle) -> [f64; 5] {
    {
        let mut s = FileStore::open(dir).expect("open");
        s.import(bundle).expect("load workload");
    }
    let open = time_ms(15, || FileStore::open(dir).expect("open").tags().len());
    let q = Query {
        text: Some(NEEDLE.to_lowercase()),
        ..Query::default()
    };
    let first = time_ms(5, || FileStore::open(dir).expect("open").search(&q).len());
    let mut s = FileStore::open(dir).expect("open");
    let tag = s.tags()[0].id.clone();
    let append = time_ms(21, || s.append(new_entry(&tag)).expect("append"));
    let hits = s.search(&q).len();
    let search = time_ms(11, || s.search(&q).len());
    let (a, b) = week();
    let wq = Query {
        since: Some(a),
        until: Some(b),
        ..Query::default()
    };
    let export = time_ms(11, || report::csv(&report::select(&s, &wq, start())).len());
    eprintln!("loopside: {hits} search hits");
    [open, first, append, search, export]
}

fn sqlite_open(path: &Path) -> Connection {
    let c = Connection::open(path).expect("sqlite open");
    c.pragma_update(None, "journal_mode", "WAL").expect("wal");
    c.pragma_update(None, "synchronous", "FULL").expect("full");
    c
}

fn sqlite_tags(c: &Connection) -> Vec<TagRecord> {
    let mut st = c
        .prepare_cached("SELECT id, json FROM tags")
        .expect("prepare");
    st.query_map([], |r| Ok((r.get::<_, String>(0)?, r.get::<_, String>(1)?)))
        .expect("query")
        .map(|r| {
            let (id, json) = r.expect("row");
            TagRecord {
                id: TagId(id),
                tag: serde_json::from_str(&json).expect("tag json"),
            }
        })
        .collect()
}

fn sqlite_insert(c: &Connection, e: &Entry) {
    c.prepare_cached(
        "INSERT INTO entries (id, tag, time, utc, author, kind, text, payload, status, refers_to)
         VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10)",
    )
    .expect("prepare")
    .execute(params![
        e.id.0,
        e.tag.0,
        e.time.to_rfc3339(),
        e.utc().timestamp_millis(),
        e.author,
        e.kind.as_str(),
        e.text,
        e.payload.as_ref().map(|p| p.to_string()),
        e.status.map(|s| format!("{s:?}")),
        e.refers_to.as_ref().map(|r| r.0.clone()),
    ])
    .expect("insert");
}

fn sqlite_entries(c: &Connection, sql: &str, p: impl rusqlite::Params) -> Vec<Entry> {
    let mut st = c.prepare_cached(sql).expect("prepare");
    st.query_map(p, |r| {
        let kind: String = r.get(3)?;
        let payload: Option<String> = r.get(6)?;
        Ok(Entry {
            id: EntryId(r.get(0)?),
            tag: TagId(r.get(1)?),
            time: DateTime::parse_from_rfc3339(&r.get::<_, String>(2)?).expect("time"),
            kind: Kind::parse(&kind).expect("kind"),
            author: r.get(4)?,
            text: r.get(5)?,
            payload: payload.map(|p| serde_json::from_str(&p).expect("payload")),
            status: None,
            refers_to: None,
        })
    })
    .expect("query")
    .map(|r| r.expect("row"))
    .collect()
}

const COLUMNS: &str = "id, tag, time, kind, author, text, payload";

fn bench_sqlite(path: &Path, bundle: &Bundle) -> [f64; 5] {
    {
        let mut c = sqlite_open(path);
        c.execute_batch(
            "CREATE TABLE tags (id TEXT PRIMARY KEY, number TEXT UNIQUE NOT NULL, json TEXT NOT NULL);
             CREATE TABLE entries (id TEXT PRIMARY KEY, tag TEXT NOT NULL, time TEXT NOT NULL,
                utc INTEGER NOT NULL, author TEXT, kind TEXT NOT NULL, text TEXT NOT NULL,
                payload TEXT, status TEXT, refers_to TEXT);
             CREATE INDEX entries_utc ON entries (utc);
             CREATE INDEX entries_tag ON entries (tag);",
        )
        .expect("schema");
        let tx = c.transaction().expect("tx");
        for t in &bundle.tags {
            tx.execute(
                "INSERT INTO tags (id, number, json) VALUES (?1, ?2, ?3)",
                params![
                    t.id.0,
                    t.tag.number,
                    serde_json::to_string(&t.tag).expect("json")
                ],
            )
            .expect("insert tag");
        }
        for e in &bundle.entries {
            sqlite_insert(&tx, e);
        }
        tx.commit().expect("commit");
    }
    let open = time_ms(15, || sqlite_tags(&sqlite_open(path)).len());
    let like = format!("%{}%", NEEDLE.to_lowercase());
    let sql = format!("SELECT {COLUMNS} FROM entries WHERE text LIKE ?1 ORDER BY rowid");
    let first = time_ms(5, || {
        let c = sqlite_open(path);
        let _ = sqlite_tags(&c);
        sqlite_entries(&c, &sql, [&like]).len()
    });
    let c = sqlite_open(path);
    let tags = sqlite_tags(&c);
    let tag = tags[0].id.clone();
    let append = time_ms(21, || sqlite_insert(&c, &new_entry(&tag)));
    let hits = sqlite_entries(&c, &sql, [&like]).len();
    let search = time_ms(11, || sqlite_entries(&c, &sql, [&like]).len());
    let (a, b) = week();
    let wsql = format!("SELECT {COLUMNS} FROM entries WHERE utc >= ?1 AND utc < ?2 ORDER BY rowid");
    let export = time_ms(11, || {
        let entries = sqlite_entries(&c, &wsql, [a.timestamp_millis(), b.timestamp_millis()]);
        let wanted: std::collections::HashSet<&TagId> = entries.iter().map(|e| &e.tag).collect();
        let b = Bundle {
            loopside: "bundle".into(),
            schema: report::BUNDLE_SCHEMA,
            exported: start(),
            since: Some(a),
            until: Some(b),
            tags: tags
                .iter()
                .filter(|t| wanted.contains(&t.id))
                .cloned()
                .collect(),
            entries: entries.clone(),
            references: Vec::new(),
        };
        report::csv(&b).len()
    });
    eprintln!("sqlite: {hits} search hits");
    [open, first, append, search, export]
}

fn scratch(name: &str) -> PathBuf {
    let p = std::env::temp_dir().join(format!("loopside-bench-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&p);
    std::fs::create_dir_all(&p).expect("scratch folder");
    p
}

fn main() {
    eprintln!("building the workload: {TAGS} tags, {ENTRIES} entries …");
    let bundle = workload();
    let ours_dir = scratch("loopside");
    let sqlite_dir = scratch("sqlite");
    let ours = bench_loopside(&ours_dir, &bundle);
    let theirs = bench_sqlite(&sqlite_dir.join("store.sqlite"), &bundle);
    let size = |name: &str| {
        std::fs::metadata(ours_dir.join(name))
            .map(|m| m.len() as f64 / 1e6)
            .unwrap_or(0.0)
    };
    let rows = [
        Row {
            name: "open (ready to list tags)",
            ours: ours[0],
            sqlite: theirs[0],
            target: "≤ 150 ms, ratio ≤ 1.0",
        },
        Row {
            name: "open, then a first text search",
            ours: ours[1],
            sqlite: theirs[1],
            target: "",
        },
        Row {
            name: "append one durable entry",
            ours: ours[2],
            sqlite: theirs[2],
            target: "ratio ≤ 1.5",
        },
        Row {
            name: "text search (case-insensitive)",
            ours: ours[3],
            sqlite: theirs[3],
            target: "≤ 20 ms, ratio ≤ 1.0",
        },
        Row {
            name: "export one week as CSV",
            ours: ours[4],
            sqlite: theirs[4],
            target: "",
        },
    ];
    println!(
        "\nloopside file store vs SQLite (WAL, synchronous=FULL): {TAGS} tags, {ENTRIES} entries, journal {:.1} MB, snapshot {:.1} MB",
        size(loopside::store::JOURNAL_FILE),
        size(loopside::store::SNAPSHOT_FILE)
    );
    println!(
        "{:<32} {:>12} {:>12} {:>8}  target",
        "", "loopside ms", "SQLite ms", "ratio"
    );
    for r in rows {
        println!(
            "{:<32} {:>12.2} {:>12.2} {:>8.2}  {}",
            r.name,
            r.ours,
            r.sqlite,
            r.ours / r.sqlite,
            r.target
        );
    }
    let _ = std::fs::remove_dir_all(&ours_dir);
    let _ = std::fs::remove_dir_all(&sqlite_dir);
}
