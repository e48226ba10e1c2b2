package org.lrbench.service;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.net.InetAddress;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import org.junit.jupiter.api.Test;
import org.lrbench.store.ResultStore;
import org.junit.jupiter.api.io.TempDir;
import org.openqa.selenium.By;
import org.openqa.selenium.Keys;
import org.openqa.selenium.OutputType;
import org.openqa.selenium.WebElement;
import org.openqa.selenium.chrome.ChromeDriver;
import org.openqa.selenium.chrome.ChromeDriverService;
import org.openqa.selenium.chrome.ChromeOptions;
import org.openqa.selenium.support.ui.ExpectedConditions;
import org.openqa.selenium.support.ui.WebDriverWait;

/**
 * The operator page in a real browser: headless Chromium driven by Selenium (Debian packages
 * chromium and chromium-driver; .ci/run installs them; skipped with the reason where absent).
 * Starts a lot, answers every prompt through the serial field as a scanner would, and waits for
 * the verdicts and the disposition; the screenshot goes to target/operator-page.png.
 */
class OperatorPageBrowserTests {

    @Test
    void anOperatorRunsALotFromThePage(@TempDir Path dir) throws Exception {
        try (BenchService service = new BenchService(BenchServiceApiTests.config(dir));
             HttpApi api = new HttpApi(service, InetAddress.getLoopbackAddress(), 0, null)) {
            ChromeDriver browser = browser(dir);
            try {
                browser.get("http://127.0.0.1:" + api.port() + "/");
                WebDriverWait wait = new WebDriverWait(browser, Duration.ofSeconds(60));
                wait.until(ExpectedConditions.presenceOfElementLocated(By.cssSelector("#plan option")));
                // with no run, only the start form works
                for (String id : new String[] {"stop", "skip", "serial", "again"}) {
                    assertThat(browser.findElement(By.id(id)).isEnabled()).as(id).isFalse();
                }
                assertThat(browser.findElement(By.id("start")).isEnabled()).isTrue();
                WebElement lot = browser.findElement(By.id("lot"));
                lot.clear();
                lot.sendKeys("PAGE-1");
                browser.findElement(By.id("operator")).sendKeys("Tam");
                browser.findElement(By.id("start")).click();
                for (int i = 1; i <= 8; i++) {
                    String text = "place part " + i + " of 8";
                    wait.until(ExpectedConditions.textToBePresentInElementLocated(By.id("prompt"), text));
                    // focus stays in the serial field: typing and Enter is all a scanner does
                    WebElement active = browser.switchTo().activeElement();
                    assertThat(active.getAttribute("id")).isEqualTo("serial");
                    assertThat(browser.findElement(By.id("stop")).isEnabled()).isTrue();
                    // a scanner ends a scan with Enter or, set up otherwise, with Tab: both measure
                    active.sendKeys(String.format("HC0417-%04d", i), i == 2 ? Keys.TAB : Keys.ENTER);
                    int rows = i + 1;
                    wait.until(d -> d.findElements(By.cssSelector("#parts tr")).size() >= rows);
                }
                wait.until(ExpectedConditions.textToBePresentInElementLocated(By.id("disposition"), "REJECT"));
                // the running counts against Ac/Re were shown as parts came in
                assertThat(browser.findElement(By.id("standing")).getText()).contains("major: 3 nonconforming");
                assertThat(browser.findElements(By.cssSelector("#parts td.fail"))).hasSize(3);
                assertThat(browser.findElement(By.id("reportlink")).getText()).contains("PAGE-1");
                assertThat(browser.findElements(By.cssSelector("#plot circle"))).isNotEmpty();
                // the plot's axes say what they are: frequency in Hz, |Z| in ohm
                assertThat(browser.findElement(By.id("plot")).getText()).contains("Hz").contains("ohm");
                // when the lot ends its result takes the large line where the last part's verdict stood (the
                // last part of the demo tray passes, the lot is rejected: the page must not show PASS large)
                WebElement verdict = browser.findElement(By.id("verdict"));
                assertThat(verdict.getText()).startsWith("lot PAGE-1: REJECT").doesNotContain("PASS");
                assertThat(verdict.getAttribute("class")).isEqualTo("reject");
                assertThat(browser.findElement(By.id("status")).getText()).doesNotContain("point");
                // one colour code with the report: fail and reject one colour, pass another, always with words
                Object failColour = browser.executeScript("return getComputedStyle(document.querySelector('#parts td.fail')).color");
                assertThat(browser.executeScript("return getComputedStyle(document.getElementById('verdict')).color"))
                        .isEqualTo(failColour);
                // at 1280 x 800 the lot's result is above the fold
                browser.manage().window().setSize(new org.openqa.selenium.Dimension(1280, 800));
                Object top = browser.executeScript("const r = document.getElementById('verdict').getBoundingClientRect();"
                        + " return r.bottom <= window.innerHeight && r.top >= 0;");
                assertThat(top).isEqualTo(Boolean.TRUE);
                // an event the stream delivers again (a reconnect that replays) is ignored by its sequence number
                int rowsBefore = browser.findElements(By.cssSelector("#parts tr")).size();
                browser.executeScript("source.dispatchEvent(new MessageEvent('part_done', {data:"
                        + " JSON.stringify({seq: 1, serial: 'REPLAYED', verdict: 'pass'})}));");
                assertThat(browser.findElements(By.cssSelector("#parts tr"))).hasSize(rowsBefore);
                assertThat(browser.findElement(By.id("parts")).getText()).doesNotContain("REPLAYED");
                // at 800 x 600 the prompt and the latest verdict are above the fold
                browser.manage().window().setSize(new org.openqa.selenium.Dimension(800, 600));
                for (String id : new String[] {"prompt", "verdict", "serial"}) {
                    Object fits = browser.executeScript("const r = document.getElementById(arguments[0])"
                            + ".getBoundingClientRect(); return r.bottom <= window.innerHeight && r.top >= 0;", id);
                    assertThat(fits).as(id + " above the fold at 800x600").isEqualTo(Boolean.TRUE);
                }
                Files.createDirectories(Path.of("target"));
                Files.write(Path.of("target", "operator-page.png"), browser.getScreenshotAs(OutputType.BYTES));
                // a reload shows the run's lot, not the form's default, and its result
                browser.navigate().refresh();
                wait.until(d -> "PAGE-1".equals(d.findElement(By.id("lot")).getAttribute("value")));
                wait.until(ExpectedConditions.textToBePresentInElementLocated(By.id("verdict"), "lot PAGE-1: REJECT"));
                // a new lot starts clean: the last lot's result and point status are gone
                WebElement next = browser.findElement(By.id("lot"));
                next.clear();
                next.sendKeys("PAGE-3");
                WebElement who = browser.findElement(By.id("operator"));
                who.clear();
                who.sendKeys("Tam");
                browser.findElement(By.id("start")).click();
                wait.until(d -> d.findElement(By.id("prompt")).getText().contains("place part 1 of 8")
                        || !d.findElement(By.id("startmsg")).getText().isBlank());
                assertThat(browser.findElement(By.id("startmsg")).getText()).as("start refused").isBlank();
                assertThat(browser.findElement(By.id("verdict")).getText()).doesNotContain("PAGE-1").doesNotContain("REJECT");
                assertThat(browser.findElement(By.id("status")).getText()).doesNotContain("point 7");
                assertThat(browser.findElements(By.cssSelector("#parts td.fail"))).isEmpty();
                for (int[] size : new int[][] {{1280, 800}, {800, 600}}) {
                    browser.manage().window().setSize(new org.openqa.selenium.Dimension(size[0], size[1]));
                    Object fits = browser.executeScript("const r = document.getElementById('prompt')"
                            + ".getBoundingClientRect(); return r.bottom <= window.innerHeight && r.top >= 0;");
                    assertThat(fits).as("the new lot's prompt above the fold at " + size[0] + "x" + size[1])
                            .isEqualTo(Boolean.TRUE);
                }
                browser.findElement(By.id("stop")).click();
                wait.until(ExpectedConditions.textToBePresentInElementLocated(By.id("prompt"), "stopped"));
            } finally {
                browser.quit();
            }
        }
    }

    /**
     * The paths off the happy one, in the browser: a start the simulated bench cannot run is
     * refused on the page in its own terms; a part measured again needs its reason and is
     * recorded as a second attempt; STOP ends the run between parts; starting the same lot again
     * resumes it and the table shows the parts measured before the stop as well.
     */
    @Test
    void refusalMeasureAgainStopAndResume(@TempDir Path dir) throws Exception {
        try (BenchService service = new BenchService(BenchServiceApiTests.config(dir));
             HttpApi api = new HttpApi(service, InetAddress.getLoopbackAddress(), 0, null)) {
            ChromeDriver browser = browser(dir);
            try {
                browser.get("http://127.0.0.1:" + api.port() + "/");
                WebDriverWait wait = new WebDriverWait(browser, Duration.ofSeconds(60));
                wait.until(ExpectedConditions.presenceOfElementLocated(By.cssSelector("#plan option")));
                WebElement lot = browser.findElement(By.id("lot"));
                lot.clear();
                lot.sendKeys("PAGE-2");
                browser.findElement(By.id("operator")).sendKeys("Ruth");
                // the simulated bench has no parts without a tray: refused before anything runs
                browser.findElement(By.id("tray")).clear();
                browser.findElement(By.id("start")).click();
                wait.until(d -> !d.findElement(By.id("startmsg")).getText().isBlank());
                assertThat(browser.findElement(By.id("startmsg")).getText()).contains("tray");
                assertThat(browser.findElement(By.id("stop")).isEnabled()).isFalse();
                browser.findElement(By.id("tray")).sendKeys("demo-lot.yaml");
                browser.findElement(By.id("start")).click();
                scan(browser, wait, 1, "HC0417-0001", null);
                scan(browser, wait, 2, "HC0417-0002", null);
                // at position 3, part 1 again: refused without a reason, measured with one
                wait.until(ExpectedConditions.textToBePresentInElementLocated(By.id("prompt"), "place part 3 of 8"));
                browser.findElement(By.id("serial")).sendKeys("HC0417-0001", Keys.ENTER);
                wait.until(ExpectedConditions.textToBePresentInElementLocated(By.id("status"), "reason to measure again"));
                // the prompt stays where it was
                assertThat(browser.findElement(By.id("prompt")).getText()).contains("place part 3 of 8");
                scan(browser, wait, 3, "HC0417-0001", "lead not seated");
                // STOP between parts: the run ends, the parts so far are kept
                wait.until(ExpectedConditions.textToBePresentInElementLocated(By.id("prompt"), "place part"));
                browser.findElement(By.id("stop")).click();
                wait.until(ExpectedConditions.textToBePresentInElementLocated(By.id("prompt"), "stopped"));
                wait.until(d -> d.findElement(By.id("start")).isEnabled());
                // the same lot again resumes it: the table shows what was measured before the stop
                browser.findElement(By.id("start")).click();
                wait.until(d -> d.findElements(By.cssSelector("#parts tr")).size() >= 3);
                assertThat(browser.findElement(By.id("parts")).getText()).contains("HC0417-0001").contains("HC0417-0002");
                assertThat(browser.findElement(By.id("status")).getText()).contains("already measured");
                // a skip is shown as a skip, and the prompt moves on to the next position
                wait.until(ExpectedConditions.textToBePresentInElementLocated(By.id("prompt"), "place part"));
                String at = browser.findElement(By.id("prompt")).getText().replaceAll("(?s).*place part (\\d+) of.*", "$1");
                int rows = browser.findElements(By.cssSelector("#parts tr")).size();
                browser.findElement(By.id("skip")).click();
                // the sample still needs that part: the prompt moves on to the same part number, saying another
                // part takes the skipped position's place
                wait.until(ExpectedConditions.textToBePresentInElementLocated(By.id("prompt"),
                        "place part " + at + " of 8 (1 position skipped: another part takes its place)"));
                wait.until(d -> d.findElements(By.cssSelector("#parts tr")).size() > rows);
                assertThat(browser.findElement(By.id("parts")).getText()).contains("(position skipped)")
                        .doesNotContain("skipped-");
                assertThat(browser.findElement(By.id("verdict")).getText()).contains("position skipped");
                // at both window sizes the skip and the prompt that moved on are above the fold
                for (int[] size : new int[][] {{1280, 800}, {800, 600}}) {
                    browser.manage().window().setSize(new org.openqa.selenium.Dimension(size[0], size[1]));
                    for (String id : new String[] {"prompt", "verdict"}) {
                        Object fits = browser.executeScript("const r = document.getElementById(arguments[0])"
                                + ".getBoundingClientRect(); return r.bottom <= window.innerHeight && r.top >= 0;", id);
                        assertThat(fits).as(id + " above the fold at " + size[0] + "x" + size[1]).isEqualTo(Boolean.TRUE);
                    }
                }
                Files.createDirectories(Path.of("target"));
                Files.write(Path.of("target", "operator-page-skip.png"), browser.getScreenshotAs(OutputType.BYTES));
            } finally {
                browser.quit();
            }
        }
        // the record: part 1 twice, the second attempt with its reason and the operator's name
        try (ResultStore store = ResultStore.open(dir.resolve("data").resolve("lrbench.db"))) {
            var attempts = store.attempts("PAGE-2").stream().filter(a -> a.serial().equals("HC0417-0001")).toList();
            assertThat(attempts).hasSize(2);
            assertThat(attempts.get(1).reason()).isEqualTo("lead not seated");
            assertThat(attempts.get(1).operator()).isEqualTo("Ruth");
        }
    }

    /** Headless Chromium through its driver, skipping the test with the reason where they are not installed. */
    private static ChromeDriver browser(Path dir) {
        Path chromium = Path.of("/usr/bin/chromium");
        Path driverBinary = Path.of("/usr/bin/chromedriver");
        assumeTrue(Files.isExecutable(chromium) && Files.isExecutable(driverBinary),
                "chromium and chromium-driver are not installed (apt-get install chromium chromium-driver):"
                        + " browser test skipped");
        ChromeOptions options = new ChromeOptions();
        options.setBinary(chromium.toString());
        options.addArguments("--headless=new", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
                "--disable-background-networking", "--disable-component-update", "--disable-sync",
                "--disable-dev-shm-usage", "--user-data-dir=" + dir.resolve("profile"), "--window-size=1200,1600");
        ChromeDriverService driverService = new ChromeDriverService.Builder()
                .usingDriverExecutable(driverBinary.toFile()).usingAnyFreePort().build();
        return new ChromeDriver(driverService, options);
    }

    private static void scan(ChromeDriver browser, WebDriverWait wait, int position, String serial, String reason) {
        wait.until(ExpectedConditions.textToBePresentInElementLocated(By.id("prompt"), "place part " + position + " of 8"));
        if (reason != null) {
            browser.findElement(By.id("again")).sendKeys(reason);
        }
        int before = browser.findElements(By.cssSelector("#parts tr")).size();
        browser.findElement(By.id("serial")).sendKeys(serial, Keys.ENTER);
        wait.until(d -> d.findElements(By.cssSelector("#parts tr")).size() > before);
    }
}
