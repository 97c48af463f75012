//! Headless rendering: every screen drawn by Slint's software renderer into memory, with
//! no display server and no GPU. Used by `examples/screens.rs`, the pixel tests and the
//! render bench.
//!
//! A minimal [`Platform`] hands out [`MinimalSoftwareWindow`]s and remembers the last one
//! per thread (Slint's platform is per thread, so parallel tests each get their own).

use super::{App, AppState, Screen};
use slint::platform::software_renderer::{
    MinimalSoftwareWindow, PremultipliedRgbaColor, RepaintBufferType, TargetPixel,
};
use slint::platform::{Platform, WindowAdapter, WindowEvent};
use slint::PhysicalSize;
use std::cell::RefCell;
use std::path::Path;
use std::rc::Rc;
use std::time::{Duration, Instant};

/// A render size: physical pixels and the scale factor (logical px = physical / scale).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RenderSize {
    /// Short name used in file names (`phone`, `desktop`).
    pub name: &'static str,
    /// Width, physical px.
    pub width: u32,
    /// Height, physical px.
    pub height: u32,
    /// Scale factor.
    pub scale: f32,
}

/// A phone in portrait: 1080 × 2400 at 2.75 (about 393 × 873 logical px).
pub const PHONE: RenderSize = RenderSize {
    name: "phone",
    width: 1080,
    height: 2400,
    scale: 2.75,
};

/// A laptop window: 1280 × 800 at 1.0.
pub const DESKTOP: RenderSize = RenderSize {
    name: "desktop",
    width: 1280,
    height: 800,
    scale: 1.0,
};

thread_local! {
    static LAST_WINDOW: RefCell<Option<Rc<MinimalSoftwareWindow>>> = const { RefCell::new(None) };
}

/// The headless platform: software-rendered windows in memory.
struct HeadlessPlatform {
    start: Instant,
}

impl Platform for HeadlessPlatform {
    fn create_window_adapter(&self) -> Result<Rc<dyn WindowAdapter>, slint::PlatformError> {
        let window = MinimalSoftwareWindow::new(RepaintBufferType::NewBuffer);
        LAST_WINDOW.with(|w| *w.borrow_mut() = Some(window.clone()));
        Ok(window)
    }

    fn duration_since_start(&self) -> Duration {
        self.start.elapsed()
    }
}

/// Install the headless platform on this thread (a second call on the same thread is fine).
pub fn init() -> Result<(), slint::PlatformError> {
    match slint::platform::set_platform(Box::new(HeadlessPlatform {
        start: Instant::now(),
    })) {
        Ok(()) => Ok(()),
        Err(slint::platform::SetPlatformError::AlreadySet) => Ok(()),
        Err(e) => Err(slint::PlatformError::Other(e.to_string())),
    }
}

/// One pixel as a window surface holds it: a 32-bit word `0x00RRGGBB`, the layout of the
/// desktop window's buffer (and of Android's RGBX_8888 surfaces), so headless renders and
/// the render bench cost what a real frame costs.
#[repr(transparent)]
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq)]
pub struct WindowPixel(pub u32);

impl WindowPixel {
    /// Red, green and blue, 0–255.
    pub fn rgb(self) -> [u8; 3] {
        [(self.0 >> 16) as u8, (self.0 >> 8) as u8, self.0 as u8]
    }
}

impl TargetPixel for WindowPixel {
    fn blend(&mut self, color: PremultipliedRgbaColor) {
        // Source over, with the colour already multiplied by its alpha: each channel keeps
        // (255 − alpha)/255 of what was there and adds the colour's.
        // Most pixels of a glyph's box are either empty or solid: skip the arithmetic for
        // them (the results are the same as the general case's).
        match color.alpha {
            0 if color.red | color.green | color.blue == 0 => return,
            u8::MAX => {
                *self = Self::from_rgb(color.red, color.green, color.blue);
                return;
            }
            _ => {}
        }
        let keep = u32::from(u8::MAX - color.alpha);
        let [r, g, b] = self.rgb();
        let mix = |was: u8, add: u8| (u32::from(was) * keep / 255 + u32::from(add)).min(255);
        self.0 = mix(r, color.red) << 16 | mix(g, color.green) << 8 | mix(b, color.blue);
    }

    fn from_rgb(red: u8, green: u8, blue: u8) -> Self {
        WindowPixel(u32::from(red) << 16 | u32::from(green) << 8 | u32::from(blue))
    }
}

/// One rendered frame, row by row.
#[derive(Debug, Clone, PartialEq)]
pub struct Frame {
    /// Width, px.
    pub width: u32,
    /// Height, px.
    pub height: u32,
    /// `width × height` pixels.
    pub pixels: Vec<WindowPixel>,
}

impl Frame {
    /// A frame of `width × height` pixels, all black.
    pub fn new(width: u32, height: u32) -> Frame {
        Frame {
            width,
            height,
            pixels: vec![WindowPixel::default(); (width * height) as usize],
        }
    }

    /// The pixel at (x, y) as `[r, g, b]`.
    pub fn at(&self, x: u32, y: u32) -> [u8; 3] {
        self.pixels[(y * self.width + x) as usize].rgb()
    }

    /// Write as an 8-bit RGB PNG.
    pub fn write_png(&self, path: &Path) -> std::io::Result<()> {
        let file = std::fs::File::create(path)?;
        let mut encoder = png::Encoder::new(std::io::BufWriter::new(file), self.width, self.height);
        encoder.set_color(png::ColorType::Rgb);
        encoder.set_depth(png::BitDepth::Eight);
        let mut writer = encoder.write_header().map_err(std::io::Error::other)?;
        let bytes: Vec<u8> = self.pixels.iter().flat_map(|p| p.rgb()).collect();
        writer
            .write_image_data(&bytes)
            .map_err(std::io::Error::other)?;
        writer.finish().map_err(std::io::Error::other)
    }
}

/// The app in a window of its own, drawn in memory.
pub struct Headless {
    /// The app.
    pub app: App,
    window: Rc<MinimalSoftwareWindow>,
    /// What the target buffer holds when a frame is drawn: a new buffer (draw everything,
    /// the default) or the last frame (`ReusedBuffer`, as a desktop X11 window's buffer
    /// after its first frame: only what changed is drawn again).
    repaint: std::cell::Cell<RepaintBufferType>,
}

impl Headless {
    /// Create the app on the headless platform (installing it on this thread if needed).
    pub fn new(state: AppState) -> Result<Headless, slint::PlatformError> {
        init()?;
        let app = App::new(state)?;
        let window = LAST_WINDOW
            .with(|w| w.borrow_mut().take())
            .ok_or_else(|| slint::PlatformError::Other("no headless window was created".into()))?;
        slint::ComponentHandle::show(&app.window)?;
        Ok(Headless {
            app,
            window,
            repaint: std::cell::Cell::new(RepaintBufferType::NewBuffer),
        })
    }

    /// Say what the frame passed to [`Headless::draw_into`] holds from one draw to the
    /// next, as a real window's buffer does: `ReusedBuffer` (the desktop window on X11,
    /// whose buffer keeps the last frame) or `SwappedBuffers` (on Wayland, two buffers in
    /// turn) let the renderer draw only what changed. The bench's keystroke cases use it.
    pub fn set_repaint_buffer(&self, kind: RepaintBufferType) {
        self.repaint.set(kind);
    }

    /// Set the window's size and scale factor.
    pub fn resize(&self, size: RenderSize) {
        self.window.dispatch_event(WindowEvent::ScaleFactorChanged {
            scale_factor: size.scale,
        });
        self.window
            .set_size(PhysicalSize::new(size.width, size.height));
    }

    /// Draw the current state at `size` into a new frame.
    pub fn render(&self, size: RenderSize) -> Frame {
        self.resize(size);
        let mut frame = Frame::new(size.width, size.height);
        self.draw_into(&mut frame);
        frame
    }

    /// Draw into an existing frame of the window's size (reused by the bench). With the
    /// default new-buffer repaint the whole window is drawn again; with a reused or swapped
    /// buffer ([`Headless::set_repaint_buffer`]) only what changed since the last draw.
    pub fn draw_into(&self, frame: &mut Frame) {
        slint::platform::update_timers_and_animations();
        self.window.request_redraw();
        let repaint = self.repaint.get();
        self.window.draw_if_needed(|renderer| {
            renderer.set_repaint_buffer_type(repaint);
            renderer.render(&mut frame.pixels, frame.width as usize);
        });
    }

    /// Mark the cautions read on Find fault or Check (as the technician's tap does).
    pub fn read_cautions(&self, screen: Screen) {
        use slint::ComponentHandle;
        match screen {
            Screen::Fault => self
                .app
                .window
                .global::<super::FaultAdapter>()
                .invoke_read_cautions(),
            Screen::Check => self
                .app
                .window
                .global::<super::CheckAdapter>()
                .invoke_read_cautions(),
            _ => {}
        }
    }

    /// Type readings into the Check table, point by point (as the technician does).
    pub fn type_check_readings(&self, readings: &[&str]) {
        use slint::ComponentHandle;
        let check = self.app.window.global::<super::CheckAdapter>();
        for (i, r) in readings.iter().enumerate() {
            check.invoke_found_edited(i as i32, (*r).into());
        }
    }

    /// Show the cautions again on Find fault and Check.
    pub fn reset_cautions(&self) {
        use slint::ComponentHandle;
        self.app
            .window
            .global::<super::FaultAdapter>()
            .set_cautions_read(false);
        self.app
            .window
            .global::<super::CheckAdapter>()
            .set_cautions_read(false);
    }

    /// Open the tag form on the open tag (Tags' Edit), or close it.
    pub fn tag_form(&self, open: bool) {
        use slint::ComponentHandle;
        let tags = self.app.window.global::<super::TagsAdapter>();
        if open {
            tags.invoke_edit_open();
        } else {
            tags.invoke_cancel();
        }
    }

    /// Open the tag `number` (the tag every screen works on), as a tap on it in the list.
    pub fn open_tag(&self, number: &str) {
        super::tags::open(&self.app.window, &self.app.state, number);
    }

    /// Show a screen.
    pub fn show(&self, screen: Screen) {
        self.app.show_screen(screen);
    }
}

/// How far the tag form is scrolled for the picture of its table editor: past the tag's
/// number, service, area and range, to the transfer picked (logical px).
const TABLE_SCROLL_PX: f32 = 540.0;

/// Render every screen at `size` in light and dark, writing `OUT/<size>-<screen>-<theme>.png`.
/// Returns the files written.
pub fn render_all(
    out: &Path,
    size: RenderSize,
) -> Result<Vec<std::path::PathBuf>, Box<dyn std::error::Error>> {
    std::fs::create_dir_all(out)?;
    let headless = Headless::new(AppState::demo())?;
    // Check shows an as-found check of LT-101 with its zero drifted up (invented readings).
    headless.type_check_readings(&[
        "4.09", "8.08", "12.10", "16.07", "20.06", "16.09", "12.11", "8.10", "4.10",
    ]);
    let mut written = Vec::new();
    let mut shoot = |screen: Screen, work: &str, dark: bool| -> std::io::Result<()> {
        let frame = headless.render(size);
        let path = out.join(format!(
            "{}-{}{work}-{}.png",
            size.name,
            super::screen_name(screen),
            if dark { "dark" } else { "light" }
        ));
        frame.write_png(&path)?;
        written.push(path);
        Ok(())
    };
    for dark in [false, true] {
        headless.app.set_dark(dark);
        for screen in super::SCREENS {
            headless.show(screen);
            shoot(screen, "", dark)?;
        }
        // Find fault and Check again past their cautions, to show the work itself.
        for screen in [Screen::Fault, Screen::Check] {
            headless.show(screen);
            headless.read_cautions(screen);
            shoot(screen, "-work", dark)?;
        }
        headless.reset_cautions();
        // Tags with the open tag's form: range, transfer and the whole loop.
        headless.show(Screen::Tags);
        headless.tag_form(true);
        shoot(Screen::Tags, "-work", dark)?;
        headless.tag_form(false);
        // The form of LT-605, whose volume is read through its tank's table: the table
        // editor and its curve.
        let open = headless.app.state.borrow().ui.open_tag.clone();
        headless.open_tag("LT-605");
        headless.show(Screen::Tags);
        headless.tag_form(true);
        slint::ComponentHandle::global::<super::TagsAdapter>(&headless.app.window)
            .set_form_scroll(-TABLE_SCROLL_PX);
        shoot(Screen::Tags, "-table", dark)?;
        headless.tag_form(false);
        if let Some(number) = open {
            headless.open_tag(&number);
        }
        // Intrinsic safety of TT-412, the demo loop through a barrier.
        super::tags::open(&headless.app.window, &headless.app.state, "TT-412");
        headless.show(Screen::Intrinsic);
        shoot(Screen::Intrinsic, "-work", dark)?;
        super::tags::open(&headless.app.window, &headless.app.state, "LT-101");
    }
    Ok(written)
}
