//! The HTML report (`check --html`) loaded in a real browser: headless
//! Chromium driven over the Chrome DevTools Protocol (a WebSocket, with
//! the general-purpose `tungstenite` client). The page must load with no
//! exception, no console or log error and no request but its own file
//! and data: URIs; every image must decode; the findings read from the
//! DOM must be the JSON report's; a screenshot must decode and show a
//! drawn page; on a phone-sized viewport nothing may overflow sideways;
//! and in print the print style sheet applies.
//!
//! The browser is `$CHROME`, else `/usr/bin/chromium`, else `chromium` on
//! the PATH (`.ci/run` installs Debian's package). Without one the test
//! fails when `CI=true` and otherwise says it was skipped.

mod html_page;

use std::io::{BufRead, BufReader};
use std::net::TcpStream;
use std::path::{Path, PathBuf};
use std::process::{Child, Command, Stdio};
use std::sync::mpsc;
use std::time::{Duration, Instant};

use base64::Engine as _;
use html_page::{FAILING_SPEC, Row, decode_png, distinct_colours, json_rows, make, scratch};
use serde_json::{Value, json};

/// How long the whole session may take before the test gives up.
const DEADLINE: Duration = Duration::from_secs(90);

/// The narrow phone viewport, CSS pixels (a common small phone width).
const PHONE_WIDTH: u64 = 360;

fn find_browser() -> Option<PathBuf> {
    if let Some(p) = std::env::var_os("CHROME").filter(|p| !p.is_empty()) {
        return Some(PathBuf::from(p));
    }
    let fixed = Path::new("/usr/bin/chromium");
    if fixed.is_file() {
        return Some(fixed.to_path_buf());
    }
    std::env::split_paths(&std::env::var_os("PATH")?)
        .map(|d| d.join("chromium"))
        .find(|p| p.is_file())
}

/// The browser process and its profile folder: killed and removed when
/// dropped, whether the test passed or not.
struct Browser {
    child: Child,
    profile: PathBuf,
}

impl Drop for Browser {
    fn drop(&mut self) {
        // The browser was started as the leader of its own process group:
        // end the group (its renderer and helper processes) by its id.
        let _ = Command::new("kill")
            .args(["-KILL", "--", &format!("-{}", self.child.id())])
            .stderr(Stdio::null())
            .status();
        let _ = self.child.kill();
        let _ = self.child.wait();
        for _ in 0..10 {
            if std::fs::remove_dir_all(&self.profile).is_ok() || !self.profile.exists() {
                break;
            }
            std::thread::sleep(Duration::from_millis(100));
        }
    }
}

/// Start the browser headless and return it with its DevTools WebSocket
/// address (read from the `DevTools listening on ws://...` line).
fn launch(exe: &Path, profile: &Path) -> (Browser, String) {
    use std::os::unix::process::CommandExt;
    let child = Command::new(exe)
        .args([
            "--headless",
            "--no-sandbox",
            "--disable-gpu",
            "--disable-quic",
            "--no-first-run",
            "--disable-background-networking",
            "--disable-component-update",
            "--disable-sync",
            "--disable-dev-shm-usage",
            &format!("--user-data-dir={}", profile.display()),
            "--remote-debugging-port=0",
            "about:blank",
        ])
        .stdin(Stdio::null())
        .stdout(Stdio::null())
        .stderr(Stdio::piped())
        .process_group(0)
        .spawn()
        .unwrap_or_else(|e| panic!("starting {}: {e}", exe.display()));
    let mut browser = Browser {
        child,
        profile: profile.to_path_buf(),
    };
    let stderr = browser.child.stderr.take().unwrap();
    let (tx, rx) = mpsc::channel();
    std::thread::spawn(move || {
        // Keep reading to the end so the browser never blocks on a full
        // pipe; hand over the address line.
        for line in BufReader::new(stderr).lines().map_while(Result::ok) {
            if let Some(i) = line.find("ws://") {
                let _ = tx.send(line[i..].trim().to_string());
            }
        }
    });
    let url = rx
        .recv_timeout(Duration::from_secs(30))
        .expect("the browser printed no DevTools address within 30 s");
    (browser, url)
}

/// A DevTools session over one WebSocket.
struct Cdp {
    ws: tungstenite::WebSocket<TcpStream>,
    next: u64,
    events: Vec<Value>,
    deadline: Instant,
}

impl Cdp {
    fn connect(url: &str) -> Cdp {
        let host = url
            .strip_prefix("ws://")
            .and_then(|r| r.split('/').next())
            .expect("a ws:// address");
        let stream = TcpStream::connect(host).expect("connecting to the browser");
        stream
            .set_read_timeout(Some(Duration::from_millis(500)))
            .unwrap();
        let (ws, _) = tungstenite::client(url, stream).expect("the WebSocket handshake");
        Cdp {
            ws,
            next: 0,
            events: Vec::new(),
            deadline: Instant::now() + DEADLINE,
        }
    }

    /// The next message, or None when none came within the read timeout.
    fn read(&mut self) -> Option<Value> {
        assert!(
            Instant::now() < self.deadline,
            "the browser session took longer than {DEADLINE:?}"
        );
        match self.ws.read() {
            Ok(tungstenite::Message::Text(t)) => Some(serde_json::from_str(&t).unwrap()),
            Ok(_) => None,
            Err(tungstenite::Error::Io(e))
                if matches!(
                    e.kind(),
                    std::io::ErrorKind::WouldBlock | std::io::ErrorKind::TimedOut
                ) =>
            {
                None
            }
            Err(e) => panic!("reading from the browser: {e}"),
        }
    }

    /// Call `method` (in `session`, when given) and return its result;
    /// events that arrive meanwhile are kept.
    fn call(&mut self, session: Option<&str>, method: &str, params: Value) -> Value {
        self.next += 1;
        let id = self.next;
        let mut msg = json!({"id": id, "method": method, "params": params});
        if let Some(s) = session {
            msg["sessionId"] = json!(s);
        }
        self.ws
            .send(tungstenite::Message::Text(msg.to_string().into()))
            .expect("sending to the browser");
        loop {
            let Some(m) = self.read() else { continue };
            if m["id"] == json!(id) {
                assert!(m.get("error").is_none(), "{method}: {}", m["error"]);
                return m["result"].clone();
            }
            self.events.push(m);
        }
    }

    /// Wait for the event `method`.
    fn wait_for(&mut self, method: &str) -> Value {
        loop {
            if let Some(e) = self.events.iter().find(|e| e["method"] == method) {
                return e.clone();
            }
            if let Some(m) = self.read() {
                self.events.push(m);
            }
        }
    }

    /// Evaluate a JavaScript expression returning a JSON string, in the
    /// page (the page itself has no script; this is the test's probe).
    fn eval(&mut self, session: &str, expr: &str) -> Value {
        let r = self.call(
            Some(session),
            "Runtime.evaluate",
            json!({"expression": expr, "returnByValue": true}),
        );
        assert!(r.get("exceptionDetails").is_none(), "{expr}: {r}");
        serde_json::from_str(r["result"]["value"].as_str().expect("a string")).unwrap()
    }
}

#[test]
fn the_report_loads_cleanly_in_a_headless_browser() {
    let Some(exe) = find_browser() else {
        if std::env::var("CI").as_deref() == Ok("true") {
            panic!(
                "no browser: set CHROME or install chromium (.ci/run does); CI=true never skips this test"
            );
        }
        println!(
            "skipped: no browser installed (set CHROME, or install chromium); with CI=true this fails instead"
        );
        return;
    };
    let dir = scratch("browser");
    let (page, _, report) = make(FAILING_SPEC, &dir);
    let page = std::fs::canonicalize(page).unwrap();
    let page_url = format!("file://{}", page.display());
    let (browser, ws_url) = launch(&exe, &dir.join("profile"));
    let mut cdp = Cdp::connect(&ws_url);

    let target = cdp.call(None, "Target.createTarget", json!({"url": "about:blank"}));
    let attached = cdp.call(
        None,
        "Target.attachToTarget",
        json!({"targetId": target["targetId"], "flatten": true}),
    );
    let session = attached["sessionId"].as_str().unwrap().to_string();
    let s = Some(session.as_str());
    for domain in ["Page", "Runtime", "Log", "Network"] {
        cdp.call(s, &format!("{domain}.enable"), json!({}));
    }
    cdp.call(
        s,
        "Emulation.setDeviceMetricsOverride",
        json!({"width": 1000, "height": 1400, "deviceScaleFactor": 1, "mobile": false}),
    );
    let nav = cdp.call(s, "Page.navigate", json!({"url": page_url}));
    assert!(nav.get("errorText").is_none(), "navigation: {nav}");
    cdp.wait_for("Page.loadEventFired");

    // Every image decoded.
    let images = cdp.eval(
        &session,
        "JSON.stringify(Array.from(document.images).map(i => [i.complete, i.naturalWidth, i.naturalHeight]))",
    );
    let images = images.as_array().unwrap();
    assert!(!images.is_empty());
    for i in images {
        assert_eq!(i[0], true, "an image did not finish loading: {i}");
        assert!(
            i[1].as_u64().unwrap() > 0 && i[2].as_u64().unwrap() > 0,
            "{i}"
        );
    }

    // The findings in the DOM are the JSON report's.
    let dom = cdp.eval(
        &session,
        "JSON.stringify(Array.from(document.querySelectorAll('tr[data-code]')).map(r => Object.assign({}, r.dataset)))",
    );
    let rows: Vec<Row> = dom
        .as_array()
        .unwrap()
        .iter()
        .map(|d| {
            Row::from_attrs(|k| {
                let camel = k.strip_prefix("data-").unwrap();
                d[camel].as_str().unwrap_or_default().to_string()
            })
        })
        .collect();
    assert_eq!(rows, json_rows(&report));

    // A screenshot that decodes and shows a drawn page, not one flat
    // colour.
    let shot = cdp.call(s, "Page.captureScreenshot", json!({"format": "png"}));
    let bytes = base64::engine::general_purpose::STANDARD
        .decode(shot["data"].as_str().unwrap())
        .unwrap();
    let (w, h, px, ch) = decode_png(&bytes);
    assert!(w >= 900 && h >= 1000, "{w}x{h}");
    let colours = distinct_colours(&px, ch);
    assert!(colours > 100, "the screenshot has only {colours} colours");

    // A narrow phone: the page reflows, nothing overflows sideways.
    cdp.call(
        s,
        "Emulation.setDeviceMetricsOverride",
        json!({"width": PHONE_WIDTH, "height": 740, "deviceScaleFactor": 2, "mobile": true}),
    );
    let widths = cdp.eval(
        &session,
        "JSON.stringify([document.documentElement.scrollWidth, document.documentElement.clientWidth])",
    );
    let scroll = widths[0].as_u64().unwrap();
    assert!(
        scroll <= PHONE_WIDTH,
        "the page is {scroll} px wide on a {PHONE_WIDTH} px phone: {widths}"
    );

    // In print the wide tables are not clipped in scroll boxes (the
    // print style sheet applies).
    cdp.call(s, "Emulation.setEmulatedMedia", json!({"media": "print"}));
    let overflow = cdp.eval(
        &session,
        "JSON.stringify(Array.from(document.querySelectorAll('.scroll')).map(e => getComputedStyle(e).overflowX))",
    );
    let overflow = overflow.as_array().unwrap();
    assert!(!overflow.is_empty());
    assert!(overflow.iter().all(|o| o == "visible"), "{overflow:?}");

    // Nothing went wrong, and nothing was asked for but the page itself.
    for e in &cdp.events {
        let p = &e["params"];
        match e["method"].as_str().unwrap_or("") {
            "Runtime.exceptionThrown" => panic!("an exception: {p}"),
            "Runtime.consoleAPICalled" => {
                assert_ne!(p["type"], "error", "a console error: {p}")
            }
            "Log.entryAdded" => assert_ne!(p["entry"]["level"], "error", "a log error: {p}"),
            "Network.requestWillBeSent" => {
                let url = p["request"]["url"].as_str().unwrap();
                assert!(
                    url == page_url || url.starts_with("data:"),
                    "a request for {url}"
                );
            }
            _ => {}
        }
    }
    assert!(
        cdp.events
            .iter()
            .any(|e| e["method"] == "Network.requestWillBeSent"),
        "the network domain saw the page's own request"
    );
    drop(browser);
    let _ = std::fs::remove_dir_all(&dir);
}
