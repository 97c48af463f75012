//! Crash safety: a child process appends entries in a loop and is killed with SIGKILL at
//! random moments, many times. After each kill the store opens, every id the child
//! printed (printed only after `append` returned) is there, and at most one record — the
//! one in flight — is there without having been printed. A second child also rewrites
//! the snapshot after every other append, so kills land while a snapshot is being
//! written too; the store then opens to the same register as reading its journal alone.

mod util;

use loopside::journal::{Entry, Kind};
use loopside::scale::Scale;
use loopside::store::{FileStore, Store, JOURNAL_FILE};
use loopside::tag::Tag;
use std::collections::HashSet;
use std::io::{BufRead, BufReader, Write};
use std::process::{Command, Stdio};
use std::time::Duration;
use util::{Rng, TempDir};

const CHILD_ENV: &str = "LOOPSIDE_CRASH_CHILD_DIR";

/// The child's side: append forever, printing each id once it is acknowledged. Run only
/// by `killed_appends_lose_nothing_acknowledged` (hence ignored in a normal run).
#[test]
#[ignore = "run as a child process by killed_appends_lose_nothing_acknowledged"]
fn crash_child() {
    append_until_killed(false);
}

/// Like `crash_child`, also writing a snapshot after every other append. Run only by
/// `killed_snapshot_writes_lose_nothing`.
#[test]
#[ignore = "run as a child process by killed_snapshot_writes_lose_nothing"]
fn crash_child_snapshots() {
    append_until_killed(true);
}

fn append_until_killed(snapshots: bool) {
    let Some(dir) = std::env::var_os(CHILD_ENV) else {
        panic!("{CHILD_ENV} must name the data folder");
    };
    let mut store = FileStore::open(std::path::Path::new(&dir)).expect("child opens the store");
    let tag = store.tag("LT-101").expect("parent made the tag").id.clone();
    let mut out = std::io::stdout().lock();
    for i in 0u64.. {
        let text = format!("reading {i}: 3.2 mA at the marshalling terminals, wire re-made");
        let e = Entry::new(
            &tag,
            chrono::Local::now().fixed_offset(),
            "CD",
            Kind::Finding,
            &text,
        )
        .expect("valid entry");
        let id = store.append(e).expect("append");
        writeln!(out, "ID {id}").expect("print");
        out.flush().expect("flush");
        if snapshots && i % 2 == 1 {
            store.write_snapshot().expect("snapshot");
        }
    }
}

#[test]
fn killed_appends_lose_nothing_acknowledged() {
    kill_and_reopen("crash_child", 40);
}

#[test]
fn killed_snapshot_writes_lose_nothing() {
    kill_and_reopen("crash_child_snapshots", 30);
}

/// Run `child` and kill it `rounds` times; check the store after each kill.
fn kill_and_reopen(child_test: &str, rounds: usize) {
    let dir = TempDir::new("crash");
    {
        let mut s = FileStore::open(dir.path()).unwrap();
        s.add_tag(Tag::new("LT-101", Scale::linear(0.0, 4.5, "m").unwrap()).unwrap())
            .unwrap();
    }
    let me = std::env::current_exe().unwrap();
    let mut rng = Rng::from_clock("crash");
    let mut printed: HashSet<String> = HashSet::new();
    let mut unacknowledged = 0;
    for round in 0..rounds {
        let mut child = Command::new(&me)
            .args([
                "--ignored",
                "--exact",
                child_test,
                "--nocapture",
                "--test-threads=1",
            ])
            .env(CHILD_ENV, dir.path())
            .stdout(Stdio::piped())
            .stderr(Stdio::null())
            .spawn()
            .unwrap();
        let stdout = child.stdout.take().unwrap();
        let reader = std::thread::spawn(move || {
            BufReader::new(stdout)
                .lines()
                .map_while(Result::ok)
                // The first id shares a line with the harness's "test crash_child ... ".
                .filter_map(|l| l.find("ID ").map(|i| l[i + 3..].trim().to_string()))
                .collect::<Vec<String>>()
        });
        std::thread::sleep(Duration::from_millis(5 + rng.below(120)));
        child.kill().unwrap(); // SIGKILL on Unix
        child.wait().unwrap();
        let ids = reader.join().unwrap();
        printed.extend(ids);

        let s = FileStore::open(dir.path()).unwrap();
        let present: HashSet<String> = s.entries().iter().map(|e| e.id.0.clone()).collect();
        let missing: Vec<&String> = printed.iter().filter(|id| !present.contains(*id)).collect();
        assert!(
            missing.is_empty(),
            "round {round}: acknowledged ids lost: {missing:?}"
        );
        // At most the one record in flight when the child died is saved unacknowledged.
        let extra: Vec<&String> = present.iter().filter(|id| !printed.contains(*id)).collect();
        assert!(
            extra.len() <= 1,
            "round {round}: saved but never acknowledged: {extra:?}"
        );
        unacknowledged += extra.len();
        printed.extend(present.iter().cloned());
        for r in s.recoveries() {
            eprintln!("round {round}: {}", r.message);
        }
        // Whatever state the snapshot was left in, the register is the journal's.
        let copy = TempDir::new("crash-full");
        std::fs::copy(
            dir.path().join(JOURNAL_FILE),
            copy.path().join(JOURNAL_FILE),
        )
        .unwrap();
        let full = FileStore::open(copy.path()).unwrap();
        assert_eq!(s.tags(), full.tags(), "round {round}");
        assert_eq!(s.entries(), full.entries(), "round {round}");
        let leftovers: Vec<String> = util::files_under(dir.path())
            .into_iter()
            .filter(|f| f.contains(".tmp-"))
            .collect();
        assert!(leftovers.is_empty(), "round {round}: {leftovers:?}");
    }
    eprintln!(
        "{} entries, {unacknowledged} saved in flight",
        printed.len()
    );
    assert!(
        printed.len() > rounds,
        "the child appended more than once per run on average ({} in {rounds} runs)",
        printed.len()
    );
}
