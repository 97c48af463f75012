//! The Android native library: exports `android_main` for the activity and hands over to
//! loopside's Android entry (`loopside::android::main`).

/// Called by the Android activity glue when the app starts.
#[no_mangle]
fn android_main(app: loopside::android::AndroidApp) {
    loopside::android::main(app);
}
