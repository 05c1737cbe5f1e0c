;;; emacs-probe.el --- drives eglot in batch Emacs for the editor tests  -*- lexical-binding: t -*-
;;
;;   HOME=RUN DEWMARK_PROBE_CONFIG=config.el DEWMARK_PROBE_NOTE=note.md DEWMARK_PROBE_REPORT=report.json \
;;   DEWMARK_PROBE_HOVER_AT=OA: DEWMARK_PROBE_EDIT_FROM='db=24 ' DEWMARK_PROBE_EDIT_TO='db=24C ' \
;;     emacs --batch -q -l emacs-probe.el
;;
;; Loads the configuration under test as an init file would, opens the note (markdown-mode from its
;; name), lets eglot connect, then records: the diagnostics the server published and the ones flymake
;; shows; a hover at the first DEWMARK_PROBE_HOVER_AT; the diagnostics after replacing the first
;; DEWMARK_PROBE_EDIT_FROM with DEWMARK_PROBE_EDIT_TO. Writes a JSON report and exits 0, or 1 with
;; the report's "error" naming the step that failed. Batch Emacs has no command loop: where eglot
;; waits for one (its connect in post-command-hook, its didChange on an idle timer) the probe runs
;; what the command loop would run.

(require 'json)
;; An interactive Emacs activates the installed packages (eglot, markdown-mode) at start-up; batch
;; mode does not.
(package-activate-all)
;; The configuration under test, as a user's init file holds it.
(load (getenv "DEWMARK_PROBE_CONFIG") nil t)

(defvar probe-report nil "The report, an alist.")
(defvar probe-published nil "Every publishDiagnostics the server sent, newest first: (VERSION . DIAGNOSTICS).")
(defvar probe-step "start" "The step running now, for the report.")

(cl-defmethod eglot-handle-notification :before
  (_server (_method (eql textDocument/publishDiagnostics)) &key diagnostics version &allow-other-keys)
  (push (cons version (append diagnostics nil)) probe-published))

(defun probe-put (key value) (push (cons key value) probe-report))

(defun probe-finish (code)
  (with-temp-file (getenv "DEWMARK_PROBE_REPORT")
    (insert (json-encode probe-report)))
  (kill-emacs code))

(defun probe-wait (pred secs)
  "Process output until PRED holds (at most SECS seconds); its value, or an error."
  (let ((deadline (+ (float-time) secs)) (v nil))
    (while (and (not (setq v (funcall pred))) (< (float-time) deadline))
      (accept-process-output nil 0.05))
    (or v (funcall pred) (error "timed out after %s s" secs))))

(defun probe-lsp-diagnostics (diagnostics)
  "DIAGNOSTICS (plists as eglot parsed them) as alists for the report."
  (mapcar (lambda (d)
            (let ((start (plist-get (plist-get d :range) :start)))
              (list (cons 'code (plist-get d :code))
                    (cons 'severity (plist-get d :severity))
                    (cons 'line (plist-get start :line))
                    (cons 'character (plist-get start :character))
                    (cons 'message (plist-get d :message)))))
          diagnostics))

(defun probe-flymake ()
  "What flymake shows in the buffer: line (1-based), type and text of each diagnostic."
  (mapcar (lambda (d)
            (list (cons 'line (line-number-at-pos (flymake-diagnostic-beg d)))
                  (cons 'type (symbol-name (flymake-diagnostic-type d)))
                  (cons 'text (flymake-diagnostic-text d))))
          (flymake-diagnostics)))

(condition-case err
    (progn
      (probe-put 'emacsVersion emacs-version)
      (probe-put 'eglotLibrary (locate-library "eglot"))
      (setq probe-step "open")
      (find-file (getenv "DEWMARK_PROBE_NOTE"))
      (probe-put 'majorMode (symbol-name major-mode))
      (setq probe-step "connect")
      ;; eglot-ensure connects from post-command-hook: run it as the command loop would.
      (run-hooks 'post-command-hook)
      (let ((server (probe-wait #'eglot-current-server 20)))
        (probe-put 'serverInfo (eglot--server-info server))
        (probe-put 'languageId (eglot--language-id server)))
      (setq probe-step "diagnostics")
      (let ((first (probe-wait (lambda () (car probe-published)) 20)))
        (probe-put 'diagnostics (probe-lsp-diagnostics (cdr first))))
      (probe-wait (lambda () (or (flymake-diagnostics) (null (cdar probe-published)))) 10)
      (probe-put 'flymake (probe-flymake))
      (setq probe-step "hover")
      (goto-char (point-min))
      (search-forward (getenv "DEWMARK_PROBE_HOVER_AT"))
      (goto-char (match-beginning 0))
      (let ((hover (jsonrpc-request (eglot--current-server-or-lose) :textDocument/hover
                                    (eglot--TextDocumentPositionParams))))
        (probe-put 'hover (plist-get (plist-get hover :contents) :value)))
      (setq probe-step "edit")
      (goto-char (point-min))
      (search-forward (getenv "DEWMARK_PROBE_EDIT_FROM"))
      (replace-match (getenv "DEWMARK_PROBE_EDIT_TO") t t)
      (let ((before (length probe-published)))
        ;; eglot sends the change from an idle timer, which batch Emacs never reaches: run it now.
        (when eglot--change-idle-timer (timer-event-handler eglot--change-idle-timer))
        (let ((after (probe-wait (lambda () (and (> (length probe-published) before) (car probe-published))) 20)))
          (probe-put 'editVersion (car after))
          (probe-put 'diagnosticsAfterEdit (probe-lsp-diagnostics (cdr after)))))
      (setq probe-step "shutdown")
      (eglot-shutdown (eglot-current-server))
      (probe-finish 0))
  (error (probe-put 'error (format "%s: %s" probe-step (error-message-string err)))
         (probe-finish 1)))
