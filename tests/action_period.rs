//! The one period parser (the Log's *Since*, `note list` / `export --since` and `--until`).

mod util;

use chrono::{DateTime, FixedOffset, Utc};
use loopside::journal::{parse_period, parse_since, Bound};

/// Evening hand-over at Brindlemoor, 1 December 2026, 18:30 (UTC+1).
fn now() -> DateTime<FixedOffset> {
    DateTime::parse_from_rfc3339("2026-12-01T18:30:00+01:00").unwrap()
}

fn at(s: &str) -> Option<DateTime<Utc>> {
    Some(DateTime::parse_from_rfc3339(s).unwrap().with_timezone(&Utc))
}

#[test]
fn every_form_a_technician_types_reads_the_same_on_every_front() {
    let expected = [
        "2026-12-01T06:30:00+01:00",
        "2026-12-01T06:30:00+01:00",
        "2026-12-01T17:00:00+01:00",
        "2026-11-28T18:30:00+01:00",
        "2026-11-28T18:30:00+01:00",
        "2026-12-01T00:00:00+01:00",
        "2026-11-30T00:00:00+01:00",
        "2026-11-28T00:00:00+01:00",
        "2026-11-30T06:00:00+01:00",
        "2026-11-30T07:00:00+01:00",
    ];
    assert_eq!(expected.len(), util::PERIOD_FORMS.len());
    for (typed, want) in util::PERIOD_FORMS.iter().zip(expected) {
        assert_eq!(parse_since(typed, now()).unwrap(), at(want), "{typed}");
        let cli = parse_period("since", typed, Bound::Since, now(), now().offset()).unwrap();
        assert_eq!(cli, at(want), "{typed}");
    }
    for bad in util::NOT_PERIODS {
        assert_eq!(parse_since(bad, now()).unwrap_err().field, "since", "{bad}");
        let e = parse_period("until", bad, Bound::Until, now(), now().offset()).unwrap_err();
        assert_eq!(e.field, "until", "{bad}");
    }
}

#[test]
fn a_day_as_the_end_of_a_period_is_included_in_full() {
    let until = |t: &str| parse_period("until", t, Bound::Until, now(), now().offset()).unwrap();
    assert_eq!(until("today"), at("2026-12-02T00:00:00+01:00"));
    assert_eq!(until("yesterday"), at("2026-12-01T00:00:00+01:00"));
    assert_eq!(until("2026-11-30"), at("2026-12-01T00:00:00+01:00"));
    assert_eq!(until("12 h"), at("2026-12-01T06:30:00+01:00"));
    assert_eq!(until(""), None);
}
