//! The event loop: std threads and one `mpsc` channel. An input thread forwards key
//! presses, clicks and resizes; feed threads send reports; a signal thread turns
//! SIGTERM/SIGHUP into `Msg::Quit` and SIGINT into `Msg::Interrupt`. The main loop waits with `recv_timeout`,
//! drains what is pending, updates, then draws once — and only when something changed.

use std::io::Write;
use std::path::PathBuf;
use std::sync::Arc;
use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::mpsc::{self, RecvTimeoutError, Sender};
use std::thread;
use std::time::{Duration, Instant};

use chrono::Utc;
use ratatui::crossterm::event::{
    self, DisableMouseCapture, EnableMouseCapture, Event, KeyEventKind, MouseButton, MouseEventKind,
};
use ratatui::crossterm::execute;

use super::app::{App, Msg};
use super::feed;

/// The feeds to start beside the board.
#[derive(Debug, Clone, Default)]
pub struct Feeds {
    /// The operator's `observations/` folder to watch, and how often to look.
    pub folder: Option<(PathBuf, Duration)>,
    /// The folder's files as read with the operator folder (watched from where that
    /// read ended).
    pub folder_loaded: Vec<crate::observation::file::ObservationFile>,
    /// The operator's runway-state files, watched on the folder's polling pass.
    pub runway_state: Option<feed::RunwayStateWatch>,
    /// The sign-off log, watched for records written elsewhere (another board,
    /// `rhoboard signoff`).
    pub signoff_log: Option<feed::LogWatch>,
    /// A command whose output is read as reports, and how often to run it.
    pub command: Option<(String, Duration)>,
    /// Added to the wall clock when dating reports (a live board run `--at`).
    pub clock_offset: chrono::TimeDelta,
}

/// How often the folder is polled.
pub const FOLDER_POLL: Duration = Duration::from_secs(2);

fn tick_interval(app: &App) -> Duration {
    match &app.replay {
        Some(rp) if !rp.paused => Duration::from_millis(100),
        _ => Duration::from_secs(1),
    }
}

fn spawn_input(tx: Sender<Msg>, stop: Arc<AtomicBool>) {
    thread::Builder::new()
        .name("rhoboard-input".into())
        .spawn(move || {
            while !stop.load(Ordering::Relaxed) {
                match event::poll(Duration::from_millis(200)) {
                    Ok(true) => {}
                    Ok(false) => continue,
                    Err(_) => {
                        let _ = tx.send(Msg::Quit);
                        return;
                    }
                }
                let msg = match event::read() {
                    Ok(Event::Key(k)) if k.kind != KeyEventKind::Release => Msg::Key(k),
                    Ok(Event::Mouse(m)) if m.kind == MouseEventKind::Down(MouseButton::Left) => {
                        Msg::Click(m.column, m.row)
                    }
                    Ok(Event::Resize(w, h)) => Msg::Resize(w, h),
                    Ok(_) => continue,
                    Err(_) => Msg::Quit,
                };
                if tx.send(msg).is_err() {
                    return;
                }
            }
        })
        .ok();
}

fn spawn_signals(tx: Sender<Msg>) -> anyhow::Result<()> {
    use signal_hook::consts::{SIGHUP, SIGINT, SIGTERM};
    let mut signals = signal_hook::iterator::Signals::new([SIGINT, SIGTERM, SIGHUP])?;
    thread::Builder::new()
        .name("rhoboard-signals".into())
        .spawn(move || {
            if let Some(sig) = signals.forever().next() {
                let _ = tx.send(if sig == SIGINT {
                    Msg::Interrupt
                } else {
                    Msg::Quit
                });
            }
        })?;
    Ok(())
}

/// The exit status of a board the user interrupted (Ctrl-C, SIGINT): 128 + SIGINT's 2,
/// as a shell reports a command a SIGINT ended.
pub const INTERRUPTED_EXIT: u8 = 130;

/// How the board ended.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Ending {
    /// `q`, SIGTERM, SIGHUP, the terminal gone: exit 0.
    Quit,
    /// Ctrl-C or SIGINT: exit [`INTERRUPTED_EXIT`].
    Interrupted,
}

/// Runs the board until the user quits or a signal arrives; the terminal is restored
/// on every way out (ratatui's panic hook covers panics).
pub fn run(mut app: App, feeds: Feeds) -> anyhow::Result<Ending> {
    let (tx, rx) = mpsc::channel::<Msg>();
    spawn_signals(tx.clone())?;
    // Our hook goes in first: ratatui's restores the terminal, then calls this one.
    let previous = std::panic::take_hook();
    std::panic::set_hook(Box::new(move |info| {
        let _ = execute!(std::io::stdout(), DisableMouseCapture);
        previous(info);
    }));
    let mut terminal = ratatui::try_init()?;
    let _ = execute!(std::io::stdout(), EnableMouseCapture);
    let result = (|| -> anyhow::Result<()> {
        let size = terminal.size()?;
        app.update(Msg::Resize(size.width, size.height));
        let stop = Arc::new(AtomicBool::new(false));
        spawn_input(tx.clone(), stop.clone());
        if let Some((dir, every)) = feeds.folder {
            let runway = feeds.runway_state;
            feed::spawn_folder_watch(
                dir,
                every,
                feeds.clock_offset,
                runway,
                feeds.folder_loaded,
                tx.clone(),
            );
        }
        if let Some(w) = feeds.signoff_log {
            feed::spawn_log_watch(w, FOLDER_POLL, tx.clone());
        }
        if let Some((cmd, every)) = feeds.command {
            feed::spawn_feed_command(cmd, every, feeds.clock_offset, tx.clone());
        }
        drop(tx);
        let mut last = Instant::now();
        terminal.draw(|f| f.render_widget(&app, f.area()))?;
        app.take_dirty();
        while !app.quit {
            let first = match rx.recv_timeout(tick_interval(&app)) {
                Ok(m) => Some(m),
                Err(RecvTimeoutError::Timeout) => None,
                Err(RecvTimeoutError::Disconnected) => break,
            };
            let now = Instant::now();
            app.update(Msg::Tick {
                now: Utc::now(),
                elapsed: now - last,
            });
            last = now;
            for m in first.into_iter().chain(rx.try_iter()) {
                app.update(m);
            }
            // Effects (a sign-off, a save, the runway state) are done here, never in
            // `update`; an answer may queue more.
            loop {
                let effects = app.take_effects();
                if effects.is_empty() {
                    break;
                }
                for e in effects {
                    let done = super::effects::perform(&app, e, Utc::now());
                    app.update(done);
                }
            }
            if app.take_bell() {
                let mut out = std::io::stdout();
                let _ = out.write_all(b"\x07");
                let _ = out.flush();
            }
            if app.take_dirty() {
                terminal.draw(|f| f.render_widget(&app, f.area()))?;
            }
        }
        stop.store(true, Ordering::Relaxed);
        Ok(())
    })();
    let _ = execute!(std::io::stdout(), DisableMouseCapture);
    ratatui::restore();
    result?;
    Ok(if app.interrupted {
        Ending::Interrupted
    } else {
        Ending::Quit
    })
}
