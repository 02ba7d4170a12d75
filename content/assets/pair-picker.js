// The history page's "compare any two" picker: it only follows one of the diff links listed below it.
(() => {
  var form = document.querySelector("form.pair-picker");
  if (!form) return;
  form.hidden = false;
  form.addEventListener("submit", (event) => {
    event.preventDefault();
    var from = form.elements.from.value;
    var to = form.elements.to.value;
    var message = form.querySelector(".pair-message");
    var link =
      document.querySelector(`a[data-pair="${from}-${to}"]`) || document.querySelector(`a[data-pair="${to}-${from}"]`);
    if (from === to) message.textContent = "Choose two different versions.";
    else if (!link)
      message.textContent = "No comparison page for this pair; the list below has every one that was built.";
    else window.location.href = link.href;
  });
})();
