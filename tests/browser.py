"""Headless Chromium for the offline page (tests/test_page.py, bench/page_budget.py):
the OS's chromium and chromium-driver, driven by selenium, with networking disabled,
and every request the browser makes counted from its performance log (DevTools
Network events)."""
import json
import os
import shutil
import tempfile
import time

CHROMIUM = ("chromium", "chromium-browser", "google-chrome")
DRIVER = "chromedriver"
INSTALL = "apt-get update && apt-get install -y chromium chromium-driver"
# Flags that run as root in a container, start no background traffic of their own,
# and resolve no host name at all (so a stray request could only fail, never leave).
FLAGS = ("--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
         "--disable-background-networking", "--disable-component-update", "--disable-sync",
         "--disable-dev-shm-usage", "--host-resolver-rules=MAP * ~NOTFOUND",
         "--proxy-server=http://127.0.0.1:9", "--proxy-bypass-list=<-loopback>")


def find():
    """(chromium path, chromedriver path), or None when either is missing."""
    browser = next((shutil.which(n) for n in CHROMIUM if shutil.which(n)), None)
    driver = shutil.which(DRIVER)
    if browser and driver:
        return browser, driver
    return None


class Page:
    """One Chromium with the page open; close() ends it and removes its profile.

    profile: a user-data-dir to reuse (a reload test keeps local storage there)."""

    def __init__(self, url, width=768, height=1024, profile=None):
        from selenium import webdriver
        from selenium.webdriver.chrome.service import Service
        browser, driver = find()
        self.own_profile = profile is None
        self.profile = profile or tempfile.mkdtemp(prefix="lc-chromium-")
        opts = webdriver.ChromeOptions()
        opts.binary_location = browser
        for f in FLAGS:
            opts.add_argument(f)
        opts.add_argument("--user-data-dir=" + self.profile)
        opts.add_argument("--window-size=%d,%d" % (width, height))
        opts.set_capability("goog:loggingPrefs", {"performance": "ALL", "browser": "ALL"})
        self.driver = webdriver.Chrome(service=Service(executable_path=driver), options=opts)
        self.driver.set_page_load_timeout(60)
        # Networking off as well (DevTools offline emulation): only file:// can load.
        self.driver.execute_cdp_cmd("Network.enable", {})
        self.driver.execute_cdp_cmd("Network.emulateNetworkConditions", {
            "offline": True, "latency": 0, "downloadThroughput": 0, "uploadThroughput": 0})
        self.resize(width, height)
        self.url = url
        self.requests = []
        self.network()  # what the browser did before the page (its own start page)
        self.requests = []
        self.driver.get(url)

    def resize(self, width, height):
        """The viewport in CSS pixels, as on a touch device (overlay scroll bars)."""
        self.driver.execute_cdp_cmd("Emulation.setDeviceMetricsOverride", {
            "width": width, "height": height, "deviceScaleFactor": 1, "mobile": True})

    def network(self):
        """The URLs of every request the browser began since the last call (from the
        performance log: Network.requestWillBeSent and Network.webSocketCreated)."""
        urls = []
        for entry in self.driver.get_log("performance"):
            msg = json.loads(entry["message"])["message"]
            if msg["method"] == "Network.requestWillBeSent":
                urls.append(msg["params"]["request"]["url"])
            elif msg["method"] == "Network.webSocketCreated":
                urls.append(msg["params"]["url"])
        self.requests.extend(urls)
        return urls

    def wait(self, script, timeout=30.0):
        """Poll a JavaScript expression until it is truthy; its value."""
        end = time.monotonic() + timeout
        while True:
            v = self.driver.execute_script("return " + script)
            if v:
                return v
            if time.monotonic() > end:
                raise TimeoutError("page: %s still false after %.0f s" % (script, timeout))
            time.sleep(0.05)

    def ready(self, timeout=30.0):
        return self.wait("document.getElementById('out').dataset.ready === '1'", timeout)

    def out_text(self):
        return self.driver.execute_script("return document.getElementById('out').textContent")

    def type_line(self, line, timeout=10.0):
        """Type line into the input and press Enter; the output pane's new text."""
        from selenium.webdriver.common.by import By
        from selenium.webdriver.common.keys import Keys
        before = self.out_text()
        n = int(self.driver.execute_script(
            "return document.getElementById('out').dataset.lines || 0"))
        box = self.driver.find_element(By.ID, "line")
        box.clear()
        # send_keys types character by character; set the value for long lines.
        self.driver.execute_script("arguments[0].value = arguments[1]", box, line)
        box.send_keys(Keys.ENTER)
        self.wait("Number(document.getElementById('out').dataset.lines || 0) > %d" % n, timeout)
        after = self.out_text()
        assert after.startswith(before), "the output pane lost text"
        return after[len(before):].lstrip("\n")

    def console(self):
        """The browser console's messages so far (level, text)."""
        return [(e["level"], e["message"]) for e in self.driver.get_log("browser")]

    def close(self):
        try:
            self.driver.quit()  # a second quit is harmless
        finally:
            if self.own_profile:
                shutil.rmtree(self.profile, ignore_errors=True)


def file_url(path):
    return "file://" + os.path.abspath(path)
