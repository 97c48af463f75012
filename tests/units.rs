//! Unit factors against NIST SP 811, cross-checked with the `uom` crate.

mod util;

use loopside::number::{parse_in, parse_number};
use loopside::units::{convert, lookup, EngUnit};
use util::close;

fn pa(symbol: &str) -> f64 {
    convert(1.0, symbol, "Pa").unwrap()
}

#[test]
fn pressure_factors_from_nist_sp_811() {
    // NIST SP 811 (2008) Appendix B.8; tolerance = half a unit of the last digit printed there.
    close(pa("psi"), 6894.757, 0.0005, "psi");
    close(pa("bar"), 100_000.0, 0.0, "bar");
    close(pa("atm"), 101_325.0, 0.0, "atm");
    close(pa("inH2O"), 249.082, 0.0005, "inH2O at 39.2 °F");
    close(pa("inH2O@60F"), 248.84, 0.005, "inH2O at 60 °F");
    close(pa("inH2O(conv)"), 249.0889, 0.00005, "inH2O conventional");
    close(pa("mmH2O"), 9.80665, 0.0, "mmH2O conventional");
    close(pa("ftH2O"), 2988.98, 0.005, "ftH2O at 39.2 °F");
    close(pa("mmHg"), 133.3224, 0.00005, "mmHg conventional");
    close(pa("inHg"), 3386.38, 0.005, "inHg at 32 °F");
}

#[test]
fn volume_and_flow_factors_from_nist_sp_811() {
    // NIST SP 811 B.8: US gal 3.785 412 L, imperial gal 4.546 09 L, ft³ 28.316 85 L.
    close(
        convert(1.0, "US gal", "L").unwrap(),
        3.785412,
        5e-7,
        "US gal",
    );
    close(
        convert(1.0, "imp gal", "L").unwrap(),
        4.54609,
        5e-9,
        "imp gal",
    );
    close(convert(1.0, "ft3", "L").unwrap(), 28.31685, 5e-6, "ft³");
    close(
        convert(1.0, "gpm", "L/min").unwrap(),
        3.785412,
        5e-7,
        "US gpm",
    );
    close(
        convert(100.0, "m3/h", "L/s").unwrap(),
        27.777_777_8,
        1e-7,
        "m³/h",
    );
    close(convert(1.0, "t/h", "kg/h").unwrap(), 1000.0, 1e-9, "t/h");
    close(
        convert(1000.0, "lb/h", "kg/h").unwrap(),
        453.59237,
        1e-9,
        "lb/h",
    );
}

#[test]
fn cross_checked_with_uom() {
    // uom (crates.io) is a general-purpose units library with its own factor tables.
    use uom::si::f64::{Length, Pressure, ThermodynamicTemperature, VolumeRate};
    use uom::si::length::{foot, inch, meter};
    use uom::si::pressure::{bar, inch_of_mercury, kilopascal, millimeter_of_mercury, pascal, psi};
    use uom::si::thermodynamic_temperature::{degree_celsius, degree_fahrenheit};
    use uom::si::volume_rate::{cubic_meter_per_hour, gallon_per_minute, liter_per_second};

    // uom keeps NIST's factors to 7 significant figures (psi = 6894.757 Pa), so the
    // agreement asked for is 1 part in 10^6 where a factor is rounded, exact otherwise.
    let rel = |a: f64, b: f64| (a - b).abs() / b.abs().max(1e-300);
    let p = Pressure::new::<psi>(1.0).get::<pascal>();
    assert!(rel(pa("psi"), p) < 1e-6, "psi: uom {p}");
    let p = Pressure::new::<bar>(2.5).get::<kilopascal>();
    assert!(rel(convert(2.5, "bar", "kPa").unwrap(), p) < 1e-12);
    let p = Pressure::new::<millimeter_of_mercury>(1.0).get::<pascal>();
    assert!(rel(pa("mmHg"), p) < 1e-6, "mmHg: uom {p}");
    let p = Pressure::new::<inch_of_mercury>(1.0).get::<pascal>();
    assert!(rel(pa("inHg"), p) < 1e-5, "inHg: uom {p}");
    let l = Length::new::<foot>(10.0).get::<meter>();
    assert!(rel(convert(10.0, "ft", "m").unwrap(), l) < 1e-12);
    let l = Length::new::<inch>(1.0).get::<meter>();
    assert!(rel(convert(1.0, "in", "m").unwrap(), l) < 1e-12);
    let t = ThermodynamicTemperature::new::<degree_celsius>(37.0).get::<degree_fahrenheit>();
    assert!(
        rel(convert(37.0, "°C", "°F").unwrap(), t) < 1e-9,
        "°F: uom {t}"
    );
    let q = VolumeRate::new::<gallon_per_minute>(100.0).get::<liter_per_second>();
    assert!(
        rel(convert(100.0, "gpm", "L/s").unwrap(), q) < 1e-6,
        "gpm: uom {q}"
    );
    let q = VolumeRate::new::<cubic_meter_per_hour>(3000.0).get::<liter_per_second>();
    assert!(rel(convert(3000.0, "m3/h", "L/s").unwrap(), q) < 1e-12);
}

#[test]
fn round_trips_through_si() {
    for (a, b) in [
        ("bar", "psi"),
        ("inH2O", "kPa"),
        ("°F", "K"),
        ("US gpm", "m³/h"),
        ("lb/h", "t/h"),
    ] {
        let there = convert(12.5, a, b).unwrap();
        close(
            convert(there, b, a).unwrap(),
            12.5,
            1e-9,
            &format!("{a} ↔ {b}"),
        );
    }
}

#[test]
fn free_text_units_are_kept_not_converted() {
    assert_eq!(EngUnit::parse("pH"), EngUnit::Free("pH".into()));
    assert_eq!(EngUnit::parse("m3/h").symbol(), "m³/h");
    assert_eq!(convert(7.0, "pH", "bar").unwrap_err().field, "from");
    assert!(lookup("%LEL").is_none());
}

#[test]
fn numbers_as_technicians_type_them() {
    assert_eq!(parse_number("ma", "12,5"), Ok(12.5));
    assert_eq!(parse_number("ma", "+12.5"), Ok(12.5));
    assert_eq!(parse_in("load", "250 ohm", "Ω"), Ok(250.0));
    close(
        parse_in("p", "2.5 bar", "psi").unwrap(),
        36.2594,
        1e-4,
        "2.5 bar in psi",
    );
    let e = parse_number("supply", "24 V DC").unwrap_err();
    assert_eq!(e.field, "supply");
}
