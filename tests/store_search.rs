//! The register's search (over a lower-cased copy of the log's text, kept up to date as
//! entries are added) gives the same answer as the plain search over the entries, for
//! any text, including letters whose lower case is longer, shorter or depends on the
//! neighbouring letters.

use chrono::{DateTime, Duration, FixedOffset, TimeZone, Utc};
use loopside::journal::{self, Entry, EntryId, FollowUpStatus, Kind, Query, TagId};
use loopside::store::record::Record;
use loopside::store::{MemoryStore, Store};
use proptest::prelude::*;

/// Letters chosen for awkward case rules: final sigma, dotted capital I, Kelvin sign,
/// sharp s, a NUL, and plain ASCII in both cases.
const ALPHABET: &[char] = &[
    'a', 'A', 'b', 'B', 'i', 'I', ' ', 'Σ', 'σ', 'ς', 'İ', 'K', 'k', '\u{212A}', 'ß', 'ẞ', 'Δ',
    'δ', '\0', '\n', '-',
];

fn text() -> impl Strategy<Value = String> {
    proptest::collection::vec(proptest::sample::select(ALPHABET), 0..12)
        .prop_map(|v| v.into_iter().collect())
}

fn start() -> DateTime<FixedOffset> {
    FixedOffset::east_opt(3600)
        .unwrap()
        .with_ymd_and_hms(2026, 1, 1, 0, 0, 0)
        .unwrap()
}

fn entry(i: usize, (text, tag, kind, done): (String, u8, usize, bool)) -> Entry {
    let kind = Kind::ALL[kind % Kind::ALL.len()];
    let follow_up = kind == Kind::FollowUp;
    Entry {
        id: EntryId(format!("e{i}")),
        tag: TagId(format!("t{}", tag % 3)),
        time: start() + Duration::hours(i as i64),
        author: String::new(),
        kind,
        text,
        payload: None,
        status: follow_up.then_some(if done {
            FollowUpStatus::Done
        } else {
            FollowUpStatus::Open
        }),
        refers_to: (follow_up && done && i > 0).then(|| EntryId(format!("e{}", i - 1))),
    }
}

fn entries(n: usize) -> impl Strategy<Value = Vec<(String, u8, usize, bool)>> {
    proptest::collection::vec((text(), any::<u8>(), 0..5usize, any::<bool>()), 0..n)
}

fn query() -> impl Strategy<Value = Query> {
    (
        proptest::option::of(text()),
        proptest::collection::vec(0..4u8, 0..2),
        proptest::collection::vec(0..5usize, 0..2),
        proptest::option::of(0..40i64),
        proptest::option::of(0..40i64),
        any::<bool>(),
    )
        .prop_map(|(text, tags, kinds, since, until, open_only)| {
            let at = |h: i64| (start() + Duration::hours(h)).with_timezone(&Utc);
            Query {
                text,
                tags: tags.into_iter().map(|t| TagId(format!("t{t}"))).collect(),
                kinds: kinds.into_iter().map(|k| Kind::ALL[k]).collect(),
                since: since.map(at),
                until: until.map(at),
                open_only,
            }
        })
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(512))]

    #[test]
    fn register_search_equals_the_plain_search(
        first in entries(30),
        more in entries(10),
        queries in proptest::collection::vec(query(), 1..4),
    ) {
        let mut store = MemoryStore::new();
        let n = first.len();
        store
            .persist(first.into_iter().enumerate().map(|(i, p)| Record::Entry(entry(i, p))).collect())
            .unwrap();
        for q in &queries {
            prop_assert_eq!(store.search(q), journal::search(store.entries(), q), "{:?}", q);
        }
        // Entries added after the first search are found too.
        store
            .persist(more.into_iter().enumerate().map(|(i, p)| Record::Entry(entry(n + i, p))).collect())
            .unwrap();
        for q in &queries {
            prop_assert_eq!(store.search(q), journal::search(store.entries(), q), "{:?}", q);
        }
    }
}

#[test]
fn a_text_hit_in_every_entry_lists_each_once_in_log_order() {
    let mut store = MemoryStore::new();
    let texts = ["aaaa", "Aa", "xa", "a", "", "AAA"];
    let records = texts
        .iter()
        .enumerate()
        .map(|(i, t)| Record::Entry(entry(i, (t.to_string(), 0, 0, false))))
        .collect();
    store.persist(records).unwrap();
    let q = Query {
        text: Some("A".into()),
        ..Query::default()
    };
    let ids: Vec<&str> = store.search(&q).iter().map(|e| e.id.as_str()).collect();
    assert_eq!(ids, ["e0", "e1", "e2", "e3", "e5"]);
    let q = Query {
        text: Some("aa".into()),
        ..Query::default()
    };
    let ids: Vec<&str> = store.search(&q).iter().map(|e| e.id.as_str()).collect();
    assert_eq!(
        ids,
        ["e0", "e1", "e5"],
        "no match across two entries (xa|a)"
    );
}
