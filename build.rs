//! Build script: compiles the Slint UI (`ui/index.slint`) when the `ui` feature is on.
//!
//! Without the feature (core and command line only) there is nothing to do, so
//! `cargo test --no-default-features` never pays for the Slint compiler.

fn main() {
    #[cfg(feature = "ui")]
    {
        // Our own widgets draw everything the screens show; the std-widgets style only
        // matters for ScrollView, ListView and AboutSlint.
        // Debug info names elements for the UI tests (`ElementHandle` in
        // i-slint-backend-testing); it costs a few strings per element.
        let config = slint_build::CompilerConfiguration::new()
            .with_style("fluent".into())
            .with_debug_info(true);
        if let Err(e) = slint_build::compile_with_config("ui/index.slint", config) {
            // A build script reports by panicking; the message is the Slint diagnostic.
            panic!("ui/index.slint did not compile: {e}");
        }
    }
}
