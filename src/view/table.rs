//! The characterisation table's curve as the tag form draws it: the table's rows as typed,
//! turned into positions on a small plot (fractions of the plot: x across from the left,
//! y down from the top) and the four axis labels. Rows that do not read as two numbers
//! are left off the curve (the form names them when the tag is saved).

use crate::display;
use crate::number::parse_number;

/// A position on the plot, as fractions of its width (x, from the left) and height
/// (y, from the top).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PlotPoint {
    /// Across, 0 at the left edge (the lowest input), 1 at the right edge.
    pub x: f64,
    /// Down, 0 at the top edge (the highest output), 1 at the bottom edge.
    pub y: f64,
}

/// What the table's plot shows.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct TableCurve {
    /// The table's points, sorted by input.
    pub points: Vec<PlotPoint>,
    /// Dots close enough together to draw the straight lines between the points.
    pub trace: Vec<PlotPoint>,
    /// The lowest input, at the left edge (`0.00 m`).
    pub input_low: String,
    /// The highest input, at the right edge.
    pub input_high: String,
    /// The lowest output, at the bottom edge (`0.00 m³`).
    pub output_low: String,
    /// The highest output, at the top edge.
    pub output_high: String,
    /// The plot in words, for a screen reader; empty when there is nothing to draw.
    pub description: String,
}

/// Distance between two dots of the trace, as a fraction of the plot.
const TRACE_STEP: f64 = 0.01;

/// The curve of the rows as typed (input, output), the input in `input_unit` and the
/// output in `output_unit`. Fewer than two readable rows draw nothing.
pub fn curve(rows: &[(String, String)], input_unit: &str, output_unit: &str) -> TableCurve {
    let mut pairs: Vec<(f64, f64)> = rows
        .iter()
        .filter_map(|(i, o)| {
            Some((
                parse_number("input", i).ok()?,
                parse_number("output", o).ok()?,
            ))
        })
        .collect();
    if pairs.len() < 2 {
        return TableCurve::default();
    }
    pairs.sort_by(|a, b| a.0.total_cmp(&b.0));
    let (x_low, x_high) = (pairs[0].0, pairs[pairs.len() - 1].0);
    let y_low = pairs.iter().map(|p| p.1).fold(f64::INFINITY, f64::min);
    let y_high = pairs.iter().map(|p| p.1).fold(f64::NEG_INFINITY, f64::max);
    // A flat run (every input or every output the same) is drawn across the middle.
    let across = |v: f64, low: f64, high: f64| {
        if high > low {
            (v - low) / (high - low)
        } else {
            0.5
        }
    };
    let points: Vec<PlotPoint> = pairs
        .iter()
        .map(|&(i, o)| PlotPoint {
            x: across(i, x_low, x_high),
            y: 1.0 - across(o, y_low, y_high),
        })
        .collect();
    let mut trace = Vec::new();
    for pair in points.windows(2) {
        let (a, b) = (pair[0], pair[1]);
        let length = ((b.x - a.x).powi(2) + (b.y - a.y).powi(2)).sqrt();
        let steps = (length / TRACE_STEP).ceil().max(1.0) as usize;
        for s in 0..steps {
            let t = s as f64 / steps as f64;
            trace.push(PlotPoint {
                x: a.x + t * (b.x - a.x),
                y: a.y + t * (b.y - a.y),
            });
        }
    }
    if let Some(last) = points.last() {
        trace.push(*last);
    }
    let input = |v: f64| display::value(v, input_unit.trim(), x_high - x_low);
    let output = |v: f64| display::value(v, output_unit.trim(), y_high - y_low);
    TableCurve {
        description: format!(
            "Table curve, {} points: {} to {} gives {} to {}",
            points.len(),
            input(x_low),
            input(x_high),
            output(pairs[0].1),
            output(pairs[pairs.len() - 1].1)
        ),
        points,
        trace,
        input_low: input(x_low),
        input_high: input(x_high),
        output_low: output(y_low),
        output_high: output(y_high),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn rows(pairs: &[(&str, &str)]) -> Vec<(String, String)> {
        pairs
            .iter()
            .map(|(i, o)| (i.to_string(), o.to_string()))
            .collect()
    }

    fn near(a: f64, b: f64) -> bool {
        (a - b).abs() < 1e-4
    }

    #[test]
    fn a_horizontal_cylinder_level_to_volume_table() {
        // A horizontal cylindrical tank, radius r = 1 m (2 m across), L = 5 m long. The
        // volume at level h is L·(r²·acos((r−h)/r) − (r−h)·√(2rh−h²)), the circular
        // segment area times the length (standard geometry, worked by hand):
        //   h = 0.5 m: 5·(acos(0.5) − 0.5·√0.75) = 5·(1.047198 − 0.433013) = 3.0709 m³
        //   h = 1.0 m: 5·acos(0)                  = 5·1.570796            = 7.8540 m³
        //   h = 1.5 m: 5·(acos(−0.5) + 0.5·√0.75) = 5·(2.094395 + 0.433013) = 12.6370 m³
        //   h = 2.0 m: 5·acos(−1) = 5π = 15.7080 m³ (full: π·r²·L)
        // Typed out of order and with decimal commas, as a technician might.
        let c = curve(
            &rows(&[
                ("0", "0"),
                ("1", "7,854"),
                ("0,5", "3,0709"),
                ("1.5", "12.637"),
                ("2", "15,708"),
            ]),
            "m",
            "m³",
        );
        assert_eq!(c.points.len(), 5);
        let xs: Vec<f64> = c.points.iter().map(|p| p.x).collect();
        assert_eq!(xs, vec![0.0, 0.25, 0.5, 0.75, 1.0]);
        // Half full at mid-level: the middle point sits at half the plot's height.
        assert!(near(c.points[2].y, 0.5), "{:?}", c.points[2]);
        // At a quarter of the level only 3.0709 / 15.708 = 19.55 % of the volume: the
        // point sits well below the straight line from empty to full (y = 0.75).
        assert!(
            near(c.points[1].y, 1.0 - 3.0709 / 15.708),
            "{:?}",
            c.points[1]
        );
        assert!(c.points[1].y > 0.75);
        // And symmetric about the middle (12.637 = 15.708 − 3.0709).
        assert!(near(c.points[3].y, 1.0 - c.points[1].y));
        assert_eq!(
            (c.input_low.as_str(), c.input_high.as_str()),
            ("0.0000 m", "2.0000 m")
        );
        assert_eq!(c.output_low, "0.000 m³");
        assert_eq!(c.output_high, "15.708 m³");
        assert_eq!(
            c.description,
            "Table curve, 5 points: 0.0000 m to 2.0000 m gives 0.000 m³ to 15.708 m³"
        );
        // The trace runs from the first point to the last without gaps wider than a step.
        assert_eq!(c.trace.first(), c.points.first());
        assert_eq!(c.trace.last(), c.points.last());
        for pair in c.trace.windows(2) {
            let gap = ((pair[1].x - pair[0].x).powi(2) + (pair[1].y - pair[0].y).powi(2)).sqrt();
            assert!(gap <= TRACE_STEP + 1e-12, "{gap}");
        }
    }

    #[test]
    fn rows_still_being_typed_are_left_off_the_curve() {
        // A half-typed third row and an empty fourth: only the two good rows are drawn.
        let c = curve(
            &rows(&[("0", "0"), ("1", "5,1"), ("2", ""), ("", "")]),
            "m",
            "m³",
        );
        assert_eq!(
            c.points,
            vec![PlotPoint { x: 0.0, y: 1.0 }, PlotPoint { x: 1.0, y: 0.0 }]
        );
        // One readable row is not a curve.
        assert_eq!(
            curve(&rows(&[("0", "0"), ("x", "1")]), "m", "m³"),
            TableCurve::default()
        );
        assert_eq!(curve(&[], "m", "m³"), TableCurve::default());
    }

    #[test]
    fn a_falling_table_is_drawn_falling() {
        // Ullage from level (common practice for a vented tank's free space): 0 m → 10 m³
        // free, 2 m → 0 m³ free.
        let c = curve(&rows(&[("0", "10"), ("2", "0")]), "m", "m³");
        assert_eq!(
            c.points,
            vec![PlotPoint { x: 0.0, y: 0.0 }, PlotPoint { x: 1.0, y: 1.0 }]
        );
        // Two rows with the same output are drawn flat across the middle (the form names
        // the fault when saving).
        let flat = curve(&rows(&[("0", "3"), ("2", "3")]), "m", "m³");
        assert!(flat.points.iter().all(|p| p.y == 0.5));
    }
}
