//! report.html in a real browser: headless Chromium lays the page out,
//! every chart (each `<svg data-chart>`) has a non-empty box, the page
//! refers to nothing outside itself, the console stays silent, and a
//! screenshot is saved as target/report-screenshot.png for people to see
//! (and the pages of `compare` and `roll` likewise).
//!
//! The report has no scripts. To read the chart boxes, the test writes a
//! copy of the page with one inline script at the end of the body that
//! writes each box into the DOM, which `--dump-dom` then prints. Chromium
//! must be installed (scripts/setup.sh does it); without it the test fails.

mod report_fixture;
mod roll_fixture;

use std::path::{Path, PathBuf};
use std::process::{Command, Output, Stdio};
use std::time::{Duration, Instant};

use report_fixture::planned;

const PROBE: &str = "<script>(function(){var lines=[];\
document.querySelectorAll('svg').forEach(function(s){var r=s.getBoundingClientRect();\
lines.push((s.getAttribute('data-chart')||'(unnamed)')+' '+r.width+' '+r.height);});\
var links=document.querySelectorAll('[src],[href],link,img,iframe,object,embed,audio,source,track').length;\
for(var i=0;i<document.styleSheets.length;i++){var rules=document.styleSheets[i].cssRules;\
for(var j=0;j<rules.length;j++){if(/url\\(|@import|@font-face/.test(rules[j].cssText))links++;}}\
lines.push('external '+links+' 0');\
var p=document.createElement('pre');p.id='chart-boxes';p.textContent=lines.join('\\n');\
document.body.appendChild(p);})();</script>";

fn chromium() -> PathBuf {
    let candidates = [
        std::env::var_os("LOTWRIGHT_CHROMIUM").map(PathBuf::from),
        Some(PathBuf::from("/usr/bin/chromium")),
        Some(PathBuf::from("/usr/bin/chromium-browser")),
    ];
    candidates
        .into_iter()
        .flatten()
        .find(|p| p.exists())
        .unwrap_or_else(|| {
            panic!(
                "Chromium is not installed (looked for /usr/bin/chromium, /usr/bin/chromium-browser \
                 and $LOTWRIGHT_CHROMIUM). Install it with `bash scripts/setup.sh` or \
                 `apt-get install -y chromium`; this test needs a real browser."
            )
        })
}

/// The target folder (CARGO_TARGET_TMPDIR is its `tmp` subfolder).
fn target_dir() -> PathBuf {
    let tmp = PathBuf::from(env!("CARGO_TARGET_TMPDIR"));
    tmp.parent().map(Path::to_path_buf).unwrap_or(tmp)
}

/// Runs headless Chromium on a page with a fresh profile, killing it if it
/// hangs for a minute.
fn run_chromium(extra: &[String], page: &Path) -> Output {
    let profile = tempfile::tempdir().expect("a profile folder");
    let mut args: Vec<String> = [
        "--headless",
        "--no-sandbox",
        "--disable-gpu",
        "--disable-quic",
        "--no-first-run",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
        "--hide-scrollbars",
        "--enable-logging=stderr",
        "--v=0",
        "--window-size=1280,2000",
    ]
    .iter()
    .map(|s| s.to_string())
    .collect();
    args.push(format!("--user-data-dir={}", profile.path().display()));
    args.extend(extra.iter().cloned());
    args.push(format!("file://{}", page.display()));
    let mut child = Command::new(chromium())
        .args(&args)
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("Chromium starts");
    let started = Instant::now();
    loop {
        if child
            .try_wait()
            .expect("Chromium can be waited for")
            .is_some()
        {
            break;
        }
        if started.elapsed() > Duration::from_secs(60) {
            let _ = child.kill();
            panic!("Chromium did not finish within 60 s");
        }
        std::thread::sleep(Duration::from_millis(100));
    }
    let output = child.wait_with_output().expect("Chromium's output");
    assert!(
        output.status.success(),
        "Chromium failed: {}",
        String::from_utf8_lossy(&output.stderr)
    );
    output
}

/// Console messages Chromium logged (`CONSOLE` lines on stderr).
fn console_lines(output: &Output) -> Vec<String> {
    String::from_utf8_lossy(&output.stderr)
        .lines()
        .filter(|l| l.contains(":CONSOLE"))
        .map(str::to_string)
        .collect()
}

/// Lays `page` out in Chromium: a screenshot saved as `target/{shot}`, no
/// console message, nothing outside the page referred to; returns every
/// chart's name and box.
fn lay_out(page: &str, name: &str, shot: &str) -> Vec<(String, f64, f64)> {
    let folder = PathBuf::from(env!("CARGO_TARGET_TMPDIR")).join("report-browser");
    std::fs::create_dir_all(&folder).unwrap();
    let report = folder.join(format!("{name}.html"));
    std::fs::write(&report, page).unwrap();
    let screenshot = target_dir().join(shot);
    let _ = std::fs::remove_file(&screenshot);
    let taken = run_chromium(&[format!("--screenshot={}", screenshot.display())], &report);
    assert_eq!(
        console_lines(&taken),
        Vec::<String>::new(),
        "console output"
    );
    let png = std::fs::read(&screenshot).expect("the screenshot is written");
    assert!(png.starts_with(b"\x89PNG\r\n\x1a\n"), "a PNG file");
    let width = u32::from_be_bytes(png[16..20].try_into().unwrap());
    assert_eq!(width, 1280, "the screenshot has the window's width");
    assert!(
        png.len() > 20_000,
        "the screenshot is not blank ({} bytes)",
        png.len()
    );

    // The chart boxes, measured by the probe copy of the page.
    let probe = folder.join(format!("{name}-probe.html"));
    let body_end = page.rfind("</body>").expect("the page has a body");
    std::fs::write(
        &probe,
        format!("{}{PROBE}{}", &page[..body_end], &page[body_end..]),
    )
    .unwrap();
    let dump = run_chromium(&["--dump-dom".into()], &probe);
    assert_eq!(
        console_lines(&dump),
        Vec::<String>::new(),
        "probe console output"
    );
    let dom = String::from_utf8_lossy(&dump.stdout);
    let start = dom.find("<pre id=\"chart-boxes\">").expect("the probe ran") + 22;
    let end = start + dom[start..].find("</pre>").expect("the probe's end");
    let mut boxes: Vec<(String, f64, f64)> = dom[start..end]
        .lines()
        .map(|line| {
            let mut parts = line.rsplitn(3, ' ');
            let height: f64 = parts.next().unwrap().parse().unwrap();
            let width: f64 = parts.next().unwrap().parse().unwrap();
            (parts.next().unwrap().to_string(), width, height)
        })
        .collect();
    // Nothing in the page, as the browser parsed it, points outside it: no
    // element with src or href, no url(), @import or @font-face in a style.
    let external = boxes
        .iter()
        .position(|b| b.0 == "external")
        .expect("the link count");
    let (_, links, _) = boxes.remove(external);
    assert_eq!(links, 0.0, "the page refers to {links} outside resources");
    for (name, width, height) in &boxes {
        assert_ne!(name, "(unnamed)", "every svg is a named chart");
        assert!(
            *width > 100.0 && *height > 50.0,
            "{name}: box {width} x {height}"
        );
        assert!(*width <= 1280.0, "{name}: wider than the window ({width})");
    }
    boxes
}

#[test]
fn every_chart_has_a_box_the_console_is_silent_and_a_screenshot_is_saved() {
    let (_dir, scenario, outcome) = planned();
    let page = lotwright::report::html::plan(&scenario, &outcome);
    let folder = PathBuf::from(env!("CARGO_TARGET_TMPDIR")).join("report-browser");
    std::fs::create_dir_all(&folder).unwrap();

    // The console check only means something if Chromium reports console
    // messages here: a page that logs an error must be caught.
    let canary = folder.join("canary.html");
    std::fs::write(
        &canary,
        "<!DOCTYPE html><body><script>console.error('canary error')</script></body>",
    )
    .unwrap();
    let caught = console_lines(&run_chromium(&["--dump-dom".into()], &canary));
    assert!(
        caught.iter().any(|l| l.contains("canary error")),
        "Chromium does not log console messages to stderr; the check below would be blind"
    );

    let boxes = lay_out(&page, "report", "report-screenshot.png");
    let names: Vec<&str> = boxes.iter().map(|b| b.0.as_str()).collect();
    // The dump escapes text, so the id with markup is counted, not named.
    for expected in ["cost-by-method", "load-PRESS", "stock-TIN", "stock-RACK"] {
        assert!(names.contains(&expected), "chart {expected} in {names:?}");
    }
    assert_eq!(boxes.len(), 2 + scenario.items.len(), "{names:?}");
}

/// The page of `compare`: the fixture against itself with the press's
/// capacity raised and one item's demand doubled. Its stock chart and the
/// press's load chart are laid out, and the page names both sides.
#[test]
fn the_comparison_page_lays_out_with_its_charts() {
    use lotwright::compare::{apply, parse_override, Comparison, Side};
    let (_dir, scenario, outcome) = planned();
    let mut changed = scenario.clone();
    for text in ["capacity.PRESS=150%", "demand.TIN=200%"] {
        apply(&mut changed, &parse_override(text).unwrap()).unwrap();
    }
    let other = lotwright::solve::plan_scenario(&changed, &Default::default()).unwrap();
    let comparison = Comparison::new(
        Side {
            name: "fixture".into(),
            scenario,
            result: outcome.chosen,
        },
        Side {
            name: "fixture with more press and TIN".into(),
            scenario: changed,
            result: other.chosen,
        },
    );
    let page = lotwright::report::html::compare(&comparison);
    assert!(page.contains("fixture with more press and TIN"));
    let boxes = lay_out(&page, "compare", "compare-screenshot.png");
    let names: Vec<&str> = boxes.iter().map(|b| b.0.as_str()).collect();
    assert_eq!(names, ["compare-stock", "compare-load-PRESS"], "{names:?}");
}

/// A plan over a bill of material (three levels, a bought-in part shared by
/// two sub-assemblies): the page gains the chart of stock by level and its
/// table, and lays out like the others. Invented data.
#[test]
fn a_bill_of_material_adds_the_stock_by_level_chart() {
    let dir = tempfile::tempdir().unwrap();
    let files = [
        ("scenario.toml", "name = \"three levels\"\nstart = \"2027-01-04\"\nbucket = \"week\"\nperiods = 6\n"),
        (
            "items.csv",
            "item,setup_cost,holding_cost,unit_cost,lead_time\n\
             KIT,60,0.5,20,0\nFRAME,40,0.3,8,1\nPANEL,40,0.3,6,0\nSHEET,30,0.1,2,1\n",
        ),
        ("demand.csv", "item,period,quantity\nKIT,3,40\nKIT,4,30\nKIT,6,50\nPANEL,5,10\n"),
        (
            "bom.csv",
            "parent,component,quantity_per\nKIT,FRAME,1\nKIT,PANEL,2\nFRAME,SHEET,1\nPANEL,SHEET,0.5\n",
        ),
        ("receipts.csv", "item,period,quantity\nFRAME,1,40\nSHEET,1,60\n"),
    ];
    for (name, body) in files {
        std::fs::write(dir.path().join(name), body).unwrap();
    }
    let scenario = lotwright::input::read_scenario(dir.path()).expect("the bill reads");
    assert_eq!(scenario.low_level_codes(), vec![0, 1, 1, 2]);
    let outcome = lotwright::solve::plan_scenario(&scenario, &Default::default()).unwrap();
    let page = lotwright::report::html::plan(&scenario, &outcome);
    assert!(page.contains("Stock by level of the bill of material"));
    assert!(
        page.contains("<td>FRAME, PANEL</td>"),
        "the level table names its items"
    );
    let boxes = lay_out(&page, "levels", "report-levels-screenshot.png");
    let names: Vec<&str> = boxes.iter().map(|b| b.0.as_str()).collect();
    assert!(names.contains(&"stock-by-level"), "{names:?}");
    assert_eq!(boxes.len(), 2 + scenario.items.len(), "{names:?}");
}

/// The page `roll --out` writes, from the real binary: the four-week demo
/// (saved as target/roll-screenshot.png) and the invented run on a press,
/// whose page also lists late units, cuts and safety stock
/// (target/roll-press-screenshot.png). Each has its three charts.
#[test]
fn the_roll_page_lays_out_with_its_charts() {
    let folder = tempfile::tempdir().unwrap();
    let demo = Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("demo-data")
        .join("harbor-bakeware-four-weeks");
    let press = folder.path().join("tinware");
    roll_fixture::write(&press);
    let runs = [
        (
            demo.clone(),
            vec![
                "--history".to_string(),
                demo.join("history").display().to_string(),
                "--horizon".into(),
                "3".into(),
                "--frozen".into(),
                "1".into(),
            ],
            "roll",
            "roll-screenshot.png",
        ),
        (
            press.clone(),
            roll_fixture::terms(&press),
            "roll-press",
            "roll-press-screenshot.png",
        ),
    ];
    for (dir, terms, name, shot) in runs {
        let out = folder.path().join(name);
        let status = Command::new(env!("CARGO_BIN_EXE_lotwright"))
            .arg("roll")
            .arg(&dir)
            .args(&terms)
            .arg("--out")
            .arg(&out)
            .stdout(Stdio::null())
            .status()
            .expect("the binary runs");
        assert!(status.success(), "roll --out on {}", dir.display());
        let page = std::fs::read_to_string(out.join("report.html")).expect("report.html");
        let boxes = lay_out(&page, name, shot);
        let names: Vec<&str> = boxes.iter().map(|b| b.0.as_str()).collect();
        assert_eq!(
            names,
            ["realised-cost", "changes-by-week", "plan-status"],
            "{name}"
        );
    }
}
