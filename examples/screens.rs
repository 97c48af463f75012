//! Render every screen with the demo plant to PNG, without a display:
//! `cargo run --release --example screens -- OUT_DIR`
//!
//! Writes `phone-<screen>-<light|dark>.png` (1080 × 2400 at scale 2.75) and
//! `desktop-<screen>-<light|dark>.png` (1280 × 800).

use loopside::app::render::{render_all, DESKTOP, PHONE};
use std::path::PathBuf;

fn main() {
    let Some(out) = std::env::args_os().nth(1).map(PathBuf::from) else {
        eprintln!("usage: screens OUT_DIR");
        std::process::exit(2);
    };
    for size in [PHONE, DESKTOP] {
        match render_all(&out, size) {
            Ok(files) => {
                for f in files {
                    println!("{}", f.display());
                }
            }
            Err(e) => {
                eprintln!("error: {e}");
                std::process::exit(1);
            }
        }
    }
}
