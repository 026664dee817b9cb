package hammerstep.sim.web;

import hammerstep.app.Main;
import hammerstep.sim.demo.DemoOptions;
import hammerstep.sim.demo.DemoRunner;
import hammerstep.web.Accounts;
import hammerstep.web.Role;
import hammerstep.web.WebSettings;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.MethodOrderer;
import org.junit.jupiter.api.Order;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.junit.jupiter.api.TestMethodOrder;
import org.openqa.selenium.By;
import org.openqa.selenium.chrome.ChromeDriver;
import org.openqa.selenium.support.ui.WebDriverWait;

import java.io.ByteArrayOutputStream;
import java.io.OutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.time.Duration;
import java.util.Base64;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.fail;

/**
 * The what-if page in a real browser (headless Chromium) over the demo station's stored traces:
 * the demo runs two parts (fast, in virtual time) keeping every trace and delivering its results
 * to a results file, and serves its view with two accounts, an engineer and a viewer. The browser
 * logs in by sending the account's Basic header with every request (set through the DevTools
 * protocol). Screenshots go to sim/target/screenshots/.
 */
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
@TestMethodOrder(MethodOrderer.OrderAnnotation.class)
class WhatIfBrowserIT {

    private static final Path STATION = Path.of("../config/demo/station.yaml");
    private static final Path FINAL = Path.of("../config/demo/programs/flange-final.yaml");
    /** The demo's final program with a tighter window: 288 to 296 N·m instead of 270 to 320 (shut-off at 288). */
    private static final String TIGHTER_FROM = "torque: { min: 270.0, target: 285.0, max: 320.0 }";
    private static final String TIGHTER_TO = "torque: { min: 288.0, target: 292.0, max: 296.0 }";

    private Path dir;
    private Path traces;
    private Path results;
    private DemoRunner runner;
    private Thread demo;
    private final CountDownLatch partsDone = new CountDownLatch(1);
    private final ByteArrayOutputStream printed = new ByteArrayOutputStream();
    private ChromeDriver browser;

    @BeforeAll
    void demoWithAccountsAndTracesAndABrowser() throws Exception {
        String missing = Browser.missing();
        if (missing != null) {
            fail(missing);
        }
        dir = Files.createTempDirectory("hammerstep-whatif-browser");
        traces = Files.createDirectories(dir.resolve("traces"));
        results = dir.resolve("results.jsonl");
        Path users = dir.resolve("web.users");
        Files.write(users, List.of(Accounts.line("eng", Role.ENGINEER, "pw-eng-4471".toCharArray()),
                Accounts.line("viewer", Role.VIEWER, "pw-view-0815".toCharArray())));
        Files.setPosixFilePermissions(users, PosixFilePermissions.fromString("rw-------"));
        OutputStream watched = new OutputStream() {
            @Override
            public synchronized void write(int b) {
                printed.write(b);
                if (b == '\n' && printed.toString(StandardCharsets.UTF_8).contains("parts done")) {
                    partsDone.countDown();
                }
            }
        };
        runner = new DemoRunner(new DemoOptions(STATION, 2, 5, true, true, 0, traces, true, null, results, null, null),
                new PrintStream(watched, true, StandardCharsets.UTF_8), new WebSettings("127.0.0.1", 0, users));
        demo = new Thread(() -> {
            try {
                runner.run();
            } catch (Exception e) {
                e.printStackTrace();
            }
        }, "demo");
        demo.setDaemon(true);
        demo.start();
        assertThat(partsDone.await(300, TimeUnit.SECONDS)).as("the demo's parts: %s", printed()).isTrue();
        assertThat(printed()).contains("(accounts of " + users + ")");
        browser = Browser.start();
    }

    @AfterAll
    void stop() throws Exception {
        if (browser != null) {
            browser.quit();
        }
        if (runner != null) {
            runner.stopServing();
            demo.join(60_000);
        }
    }

    private String printed() {
        synchronized (printed) {
            return printed.toString(StandardCharsets.UTF_8);
        }
    }

    private String url(String path) {
        return "http://127.0.0.1:" + runner.web().port() + path;
    }

    /** Every request of the browser from now on carries this account's login. */
    private void logInAs(String user, String password) {
        browser.executeCdpCommand("Network.enable", Map.of());
        browser.executeCdpCommand("Network.setExtraHTTPHeaders", Map.of("headers", Map.of("Authorization", "Basic "
                + Base64.getEncoder().encodeToString((user + ":" + password).getBytes(StandardCharsets.UTF_8)))));
    }

    private void enterProgram(String yaml) {
        browser.executeScript("document.getElementById('whatif-program').value = arguments[0];", yaml);
    }

    private int count(String id) {
        return Integer.parseInt(browser.findElement(By.id(id)).getText());
    }

    @Test
    @Order(1)
    void aWhatIfWithATighterWindowReportsTheChangesReplayCompareReports() throws Exception {
        String stored = Files.readString(FINAL);
        assertThat(stored).contains(TIGHTER_FROM);
        String tighter = stored.replace(TIGHTER_FROM, TIGHTER_TO).replace("shutoff_at: 285.0", "shutoff_at: 288.0");

        logInAs("eng", "pw-eng-4471");
        browser.get(url("/whatif"));
        assertThat(browser.findElements(By.id("whatif-form"))).hasSize(1);
        enterProgram(tighter);
        browser.findElement(By.id("whatif-run")).click();
        new WebDriverWait(browser, Duration.ofSeconds(30)).until(d -> !d.findElements(By.id("whatif-status")).isEmpty()
                || !d.findElements(By.cssSelector(".error")).isEmpty() || !d.findElements(By.tagName("pre")).isEmpty()
                || d.findElements(By.id("whatif-form")).isEmpty());
        Browser.screenshot(browser, "whatif-started");
        assertThat(browser.findElements(By.id("whatif-status"))).as("the what-if started: %s",
                browser.findElement(By.tagName("body")).getText()).isNotEmpty();
        // the page shows the run under way; reloaded until it is done
        new WebDriverWait(browser, Duration.ofSeconds(180), Duration.ofMillis(500)).until(d -> {
            d.navigate().refresh();
            return !d.findElements(By.cssSelector("#whatif-status[data-state=done]")).isEmpty()
                    || !d.findElements(By.cssSelector("#whatif-status[data-state=failed]")).isEmpty();
        });
        assertThat(browser.findElement(By.id("whatif-status")).getAttribute("data-state"))
                .as(browser.findElement(By.id("whatif-status")).getText()).isEqualTo("done");
        Browser.screenshot(browser, "whatif");

        Path changed = Files.writeString(dir.resolve("flange-final-tighter.yaml"), tighter);
        String replay = run("replay", traces.toString(), "--program", changed.toString(), "--compare",
                results.toString(), "--summary");
        Matcher m = Pattern.compile("(\\d+) joints compared: (\\d+) would change verdict \\((\\d+) GO->NO_GO, (\\d+)"
                + " NO_GO->GO\\), (\\d+) keep their verdict with other reasons").matcher(replay);
        assertThat(m.find()).as(replay).isTrue();
        assertThat(count("whatif-compared")).as(replay).isEqualTo(Integer.parseInt(m.group(1)));
        assertThat(count("whatif-changed-count")).as(replay).isEqualTo(Integer.parseInt(m.group(2)))
                .as("a tighter window changes some verdicts of the demo's joints").isPositive();
        assertThat(count("whatif-go-to-nogo")).as(replay).isEqualTo(Integer.parseInt(m.group(3)));
        assertThat(count("whatif-nogo-to-go")).as(replay).isEqualTo(Integer.parseInt(m.group(4)));
        assertThat(count("whatif-other-reasons")).as(replay).isEqualTo(Integer.parseInt(m.group(5)));
        // every reason the page counts, replay's summary counts the same
        for (var tr : browser.findElements(By.cssSelector("#whatif-by-reason tbody tr"))) {
            var td = tr.findElements(By.tagName("td"));
            assertThat(replay).as("reason %s", td.get(0).getText())
                    .containsPattern(Pattern.quote(td.get(0).getText()) + " +" + td.get(1).getText() + " +"
                            + td.get(2).getText());
        }

        // a changed joint opens with both windows drawn
        browser.findElement(By.cssSelector("a.whatif-joint")).click();
        new WebDriverWait(browser, Duration.ofSeconds(20)).until(d -> !d.findElements(By.id("whatif-trace")).isEmpty());
        String figure = browser.findElement(By.id("whatif-trace")).getAttribute("innerHTML");
        assertThat(figure).contains("class=\"curve\"").contains("new max 296.0").contains("max 320.0");
        Browser.screenshot(browser, "whatif-joint");
    }

    @Test
    @Order(2)
    void aFormWithoutItsTokenIsRefused() throws Exception {
        logInAs("eng", "pw-eng-4471");
        browser.get(url("/whatif"));
        String before = browser.findElement(By.id("whatif-status")).getText();
        enterProgram(Files.readString(FINAL));
        browser.executeScript("var t = document.getElementById('csrf'); t.parentNode.removeChild(t);");
        browser.findElement(By.id("whatif-run")).click();
        new WebDriverWait(browser, Duration.ofSeconds(20)).until(d -> d.getPageSource().contains("token"));
        assertThat(browser.findElement(By.tagName("body")).getText()).containsIgnoringCase("token");
        Browser.screenshot(browser, "whatif-no-token");
        browser.get(url("/whatif"));
        assertThat(browser.findElement(By.id("whatif-status")).getText()).as("nothing started").isEqualTo(before);
    }

    @Test
    @Order(3)
    void aViewerCannotStartAWhatIf() throws Exception {
        // the engineer's form in the page, then the viewer's login: the post is refused
        logInAs("eng", "pw-eng-4471");
        browser.get(url("/whatif"));
        String before = browser.findElement(By.id("whatif-status")).getText();
        enterProgram(Files.readString(FINAL));
        logInAs("viewer", "pw-view-0815");
        browser.findElement(By.id("whatif-run")).click();
        new WebDriverWait(browser, Duration.ofSeconds(20)).until(d -> d.findElements(By.id("whatif-form")).isEmpty());
        assertThat(browser.findElement(By.tagName("body")).getText()).contains("engineer");
        // nor does the viewer get the page or its form
        browser.get(url("/whatif"));
        assertThat(browser.findElements(By.id("whatif-form"))).isEmpty();
        assertThat(browser.findElement(By.tagName("body")).getText()).contains("engineer");
        Browser.screenshot(browser, "whatif-viewer");
        browser.get(url("/results"));
        assertThat(browser.findElement(By.tagName("main")).getText()).containsPattern("[1-9][0-9]* joints match");

        logInAs("eng", "pw-eng-4471");
        browser.get(url("/whatif"));
        assertThat(browser.findElement(By.id("whatif-status")).getText()).as("nothing started").isEqualTo(before);
    }

    /** A hammerstep command in this JVM; what it printed. */
    private static synchronized String run(String... args) {
        PrintStream saved = System.out;
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        try (PrintStream capture = new PrintStream(bytes, true, StandardCharsets.UTF_8)) {
            System.setOut(capture);
            int exit = Main.run(args);
            assertThat(exit).as(bytes.toString(StandardCharsets.UTF_8)).isZero();
        } finally {
            System.setOut(saved);
        }
        return bytes.toString(StandardCharsets.UTF_8);
    }
}
