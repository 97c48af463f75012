//! Signals that are not 4–20 mA, and the ends of a characterisation table.

mod util;

use loopside::scale::{CharTable, Scale, SignalSpan, TablePoint, Transfer};
use loopside::signal::{classify, BandLimits, SignalStatus};
use util::{close, loopside_json};

#[test]
fn two_milliamps_on_a_zero_to_twenty_signal_is_ten_percent() {
    // 0–20 mA, linear 0–100 %: 2 mA is 2/20 = 10 % of span, a valid measurement. NAMUR NE 43
    // failure bands (≤ 3.6 mA) are written for 4–20 mA and do not apply.
    let span = SignalSpan::new(0.0, 20.0).unwrap();
    let scale = Scale::new(0.0, 100.0, "%", Transfer::Linear, span).unwrap();
    let r = scale.from_ma(2.0).unwrap();
    close(r.percent, 10.0, 1e-12, "2 mA on 0–20 mA");
    assert_eq!(
        classify(2.0, &BandLimits::default(), &span).unwrap(),
        SignalStatus::InRange
    );
    let j = loopside_json(&[
        "convert", "--range", "0..100", "--unit", "%", "--signal", "0..20", "--ma", "2", "--json",
    ]);
    assert_eq!(j["status"], "in-range");
    close(j["percent"].as_f64().unwrap(), 10.0, 1e-9, "CLI 2 mA");
    let j = loopside_json(&["status", "2", "--signal", "0..20", "--json"]);
    assert_eq!(j["status"], "in-range");
    assert_eq!(j["failure"], false);
    // On 4–20 mA the same 2 mA is a downscale failure signal (NE 43: ≤ 3.6 mA).
    let j = loopside_json(&["status", "2", "--json"]);
    assert_eq!(j["status"], "fail-low");
    let j = loopside_json(&[
        "convert", "--range", "0..100", "--unit", "%", "--ma", "2", "--json",
    ]);
    assert_eq!(j["status"], "fail-low");
}

#[test]
fn a_value_off_the_end_of_a_table_says_so() {
    // A horizontal tank table (invented, Brindlemoor LT-605 style): 0–2 m → 0–12 m³.
    let t = CharTable::new(
        vec![
            TablePoint {
                input: 0.0,
                output: 0.0,
            },
            TablePoint {
                input: 1.0,
                output: 6.0,
            },
            TablePoint {
                input: 2.0,
                output: 12.0,
            },
        ],
        "m³",
    )
    .unwrap();
    // The transmitter is ranged 0–2.5 m, past the table's last point (2 m): 20 mA reads
    // 2.5 m, extrapolated along the last segment (6 m³/m) to 15 m³.
    let scale = Scale::new(0.0, 2.5, "m", Transfer::Table(t), SignalSpan::default()).unwrap();
    assert!(
        !scale.from_ma(12.0).unwrap().outside_table,
        "1.25 m is inside"
    );
    let top = scale.from_ma(20.0).unwrap();
    assert!(top.outside_table, "2.5 m is past the last point (2 m)");
    close(top.value, 15.0, 1e-9, "extrapolated along the last segment");
    // Read backwards from a value past the table, too.
    assert!(scale.from_value(14.0).unwrap().outside_table);
    let j = loopside_json(&[
        "convert",
        "--range",
        "0..2,5",
        "--unit",
        "m",
        "--table",
        "0:0;1:6;2:12",
        "--table-unit",
        "m3",
        "--ma",
        "20",
        "--json",
    ]);
    assert_eq!(j["outside_table"], true);
}
