//! When a run stops early: SIGINT, SIGTERM and SIGHUP (an interruption), and the checkpoint clock
//! (a pause to write a checkpoint).
//!
//! Both raise one flag, `stop`, that [`motley_scenario::run::advance`] looks at before every
//! sample; `interrupted` and `due` then tell the run loop why it stopped. A second signal, once
//! the first has been seen, ends the process at once with exit code 130 (signal-hook's
//! conditional shutdown), for a run whose checkpoint cannot be written quickly enough.

use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::Arc;
use std::thread::JoinHandle;
use std::time::{Duration, Instant};

use crate::exit::Failure;

/// The signals that interrupt a run: Ctrl-C, the scheduler's notice (Slurm sends SIGTERM about
/// 30 s before it kills a job) and a closed terminal.
pub const SIGNALS: [i32; 3] = [
    signal_hook::consts::SIGINT,
    signal_hook::consts::SIGTERM,
    signal_hook::consts::SIGHUP,
];

/// The flags of one run, and the checkpoint clock's thread.
pub struct Stops {
    /// Raised by a signal or by the clock: stop sampling at the next sample.
    pub stop: Arc<AtomicBool>,
    interrupted: Arc<AtomicBool>,
    due: Arc<AtomicBool>,
    ended: Arc<AtomicBool>,
    clock: Option<JoinHandle<()>>,
}

impl Stops {
    /// Installs the signal handlers and, when `every` > 0 seconds, starts the checkpoint clock.
    pub fn install(every: f64) -> Result<Self, Failure> {
        let stop = Arc::new(AtomicBool::new(false));
        let interrupted = Arc::new(AtomicBool::new(false));
        let fail = |e: std::io::Error| {
            Failure::Runtime(format!("cannot install the signal handlers: {e}"))
        };
        for sig in SIGNALS {
            // Registered first, so it sees the flag as the previous signal left it.
            signal_hook::flag::register_conditional_shutdown(sig, 130, interrupted.clone())
                .map_err(fail)?;
            signal_hook::flag::register(sig, interrupted.clone()).map_err(fail)?;
            signal_hook::flag::register(sig, stop.clone()).map_err(fail)?;
        }
        let due = Arc::new(AtomicBool::new(false));
        let ended = Arc::new(AtomicBool::new(false));
        let clock = (every > 0.0).then(|| {
            let (stop, due, ended) = (stop.clone(), due.clone(), ended.clone());
            let period = Duration::from_secs_f64(every);
            std::thread::spawn(move || {
                let mut last = Instant::now();
                while !ended.load(Ordering::SeqCst) {
                    std::thread::sleep(Duration::from_millis(50).min(period));
                    if last.elapsed() >= period {
                        due.store(true, Ordering::SeqCst);
                        stop.store(true, Ordering::SeqCst);
                        last = Instant::now();
                    }
                }
            })
        });
        Ok(Stops {
            stop,
            interrupted,
            due,
            ended,
            clock,
        })
    }

    /// Whether a signal arrived.
    pub fn interrupted(&self) -> bool {
        self.interrupted.load(Ordering::SeqCst)
    }

    /// Whether a checkpoint is due; if so, clears it and lowers `stop` again (unless a signal
    /// raised it meanwhile).
    pub fn take_due(&self) -> bool {
        if !self.due.swap(false, Ordering::SeqCst) {
            return false;
        }
        self.stop.store(false, Ordering::SeqCst);
        // A signal handler raises `interrupted` before `stop`: if it ran before the line above,
        // it is seen here; if after, it raised `stop` again itself.
        if self.interrupted() {
            self.stop.store(true, Ordering::SeqCst);
        }
        true
    }

    /// Runs `work` on another thread and waits for its outcome, or returns as soon as a signal
    /// arrives (with the channel that the outcome will still come through, if the caller wants it).
    pub fn wait_for<T: Send + 'static>(
        &self,
        work: impl FnOnce() -> T + Send + 'static,
    ) -> Waited<T> {
        let (tx, rx) = std::sync::mpsc::channel();
        std::thread::spawn(move || {
            let _ = tx.send(work());
        });
        loop {
            if self.interrupted() {
                return Waited::Interrupted(rx);
            }
            match rx.recv_timeout(Duration::from_millis(20)) {
                Ok(t) => return Waited::Done(t),
                Err(std::sync::mpsc::RecvTimeoutError::Timeout) => continue,
                // The work panicked; its message is already printed.
                Err(std::sync::mpsc::RecvTimeoutError::Disconnected) => std::process::exit(101),
            }
        }
    }
}

/// The outcome of [`Stops::wait_for`].
pub enum Waited<T> {
    /// The work finished.
    Done(T),
    /// A signal arrived first; the work goes on and its outcome comes through the receiver.
    Interrupted(std::sync::mpsc::Receiver<T>),
}

impl Drop for Stops {
    fn drop(&mut self) {
        self.ended.store(true, Ordering::SeqCst);
        if let Some(h) = self.clock.take() {
            let _ = h.join();
        }
    }
}
