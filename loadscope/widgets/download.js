// loadscope DownloadButton: a button that asks Python for a file and lets the
// browser save it. Python answers {"kind": "file", "name", "mime"} with the
// bytes as one binary buffer; nothing is sent until the button is pressed.

function render({ model, el }) {
  const button = document.createElement("button");
  button.className = "loadscope-download jupyter-button widget-button";
  const label = () => {
    button.textContent = model.get("label");
    button.title = model.get("hint");
  };
  label();
  model.on("change:label", label);
  model.on("change:hint", label);
  button.addEventListener("click", () => model.send({ kind: "download" }));
  const onMsg = (msg, buffers) => {
    if (!msg || msg.kind !== "file" || !buffers || !buffers.length) return;
    const blob = new Blob([buffers[0]], { type: String(msg.mime || "application/octet-stream") });
    const url = URL.createObjectURL(blob);
    const a = document.createElement("a");
    a.href = url;
    a.download = String(msg.name || "download");
    a.style.display = "none";
    el.appendChild(a);
    a.click();
    setTimeout(() => {
      URL.revokeObjectURL(url);
      a.remove();
    }, 1000);
  };
  model.on("msg:custom", onMsg);
  el.appendChild(button);
  return () => model.off("msg:custom", onMsg);
}

export default { render };
