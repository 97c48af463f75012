//! The period parser (`journal::parse_period`): `12 h`, `3 d`, `today`, `yesterday`,
//! `2026-11-30`, `2026-11-30 06:00`, a time with its offset.
//!
//! Input: eight bytes for "now" (seconds, taken within the years 1971 to 2998), two
//! for its offset (minutes, within ±18 h), then the text typed.
//!
//! Invariant: a refused text names the field; an accepted one is read the same by the
//! command line's time zone and the app's fixed offset when they agree; as the end of a
//! period it is never before the same text read as the start; hours or days back land
//! between a year before `now` and `now`; and the instant read, written out as a full
//! time with its offset, reads back as the same instant (within the years a typed date may
//! name, 1970 to 2999).
#![no_main]

use chrono::{Datelike, Duration, FixedOffset, TimeZone, Utc};
use libfuzzer_sys::fuzz_target;
use loopside::journal::{parse_period, Bound, FIRST_YEAR, LAST_YEAR};

fuzz_target!(|input: &[u8]| {
    if input.len() < 10 {
        return;
    }
    let (head, rest) = input.split_at(10);
    let Ok(text) = std::str::from_utf8(rest) else {
        return;
    };
    // A device clock between 1971 and 2998: typed dates are read within 1970 to 2999.
    let span = 1027 * 365 * 86_400i64;
    let secs = i64::from_le_bytes(head[..8].try_into().unwrap()).rem_euclid(span) + 366 * 86_400;
    let minutes = i32::from(i16::from_le_bytes([head[8], head[9]])) % (18 * 60);
    let zone = FixedOffset::east_opt(minutes * 60).unwrap();
    let now = zone.timestamp_opt(secs, 0).unwrap();

    let field = "since";
    let since = parse_period(field, text, Bound::Since, now, &zone);
    let until = parse_period(field, text, Bound::Until, now, &zone);
    assert_eq!(
        since.is_ok(),
        until.is_ok(),
        "{text:?}: {since:?} / {until:?}"
    );
    for r in [&since, &until] {
        if let Err(e) = r {
            assert_eq!(e.field, field);
        }
    }
    // The app passes now's own offset; here that is the same zone, so the same answer.
    assert_eq!(since, loopside::journal::parse_since(text, now), "{text:?}");
    // UTC as a time zone (the command line's, on a machine set to UTC) agrees when the
    // offset is zero.
    if minutes == 0 {
        assert_eq!(
            since,
            parse_period(field, text, Bound::Since, now, &Utc),
            "{text:?}"
        );
    }
    match (&since, &until) {
        (Ok(Some(s)), Ok(Some(u))) => {
            assert!(u >= s, "{text:?}: end {u} before start {s}");
            let lower = text.trim().to_lowercase();
            if lower.ends_with('h')
                || lower.ends_with("hour")
                || lower.ends_with("hours")
                || lower.ends_with('d')
                || lower.ends_with("day")
                || lower.ends_with("days")
            {
                let now_utc = now.with_timezone(&Utc);
                // Only hours or days back end in those letters; no date or time does.
                assert!(
                    *s <= now_utc && *s >= now_utc - Duration::days(366),
                    "{text:?}: {s} is not within a year before {now_utc}"
                );
            }
            for t in [s, u] {
                let local = t.with_timezone(&zone);
                if !(FIRST_YEAR..=LAST_YEAR).contains(&local.year()) {
                    // "366 d" early in 1971 reaches back into 1969; a typed date is never
                    // read outside these years, so it cannot be typed back.
                    continue;
                }
                let written = local.to_rfc3339();
                let back = parse_period(field, &written, Bound::Since, now, &zone);
                assert_eq!(back, Ok(Some(*t)), "{written}");
            }
        }
        (Ok(None), Ok(None)) => assert!(text.trim().is_empty()),
        (Ok(_), Ok(_)) => panic!("{text:?}: read as a start but not as an end, or the reverse"),
        _ => {}
    }
});
