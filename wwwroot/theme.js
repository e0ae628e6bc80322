// The theme chosen on this machine, applied before anything is drawn; the header's button swaps it.
try { const t = localStorage.getItem("feederlocate-theme"); if (t) document.documentElement.dataset.theme = t; } catch { }
window.feederLocateTheme = () => {
    const dark = document.documentElement.dataset.theme === "dark"
        || (!document.documentElement.dataset.theme && matchMedia("(prefers-color-scheme: dark)").matches);
    document.documentElement.dataset.theme = dark ? "light" : "dark";
    try { localStorage.setItem("feederlocate-theme", document.documentElement.dataset.theme); } catch { }
};
