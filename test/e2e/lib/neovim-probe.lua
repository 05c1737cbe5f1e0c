-- Headless Neovim (0.7 and later) as an LSP client, driven by a JSON plan; used by neovim.ts.
--
-- Run (neovim.ts does this):
--   DEWMARK_PROBE_PLAN=/abs/plan.json nvim --headless --clean -n -u NONE -c 'luafile neovim-probe.lua' -c 'cquit 2'
-- Neovim 0.7 has no `-l`; `luafile` runs this script, and the trailing `cquit 2` ends Neovim with
-- exit code 2 should the script ever return without quitting. Every error is caught (xpcall): an
-- uncaught Lua error would leave headless Neovim waiting forever.
--
-- The plan (see NeovimPlan in neovim.ts for every field):
--   { cmd = {argv...}, cmdCwd, cmdEnv, root, configFile, preludeFile, settings, initializationOptions,
--     timeoutMs, resultFile, logLevel, steps = { {op = 'open', path = ..., filetype = ...}, ... } }
-- The report is written as JSON to plan.resultFile (and as one line to stdout, after a marker), with
-- ok = true only when every step succeeded. Exit code: 0 on success, 1 on a failed step.

local started = vim.loop.hrtime()
local report = { ok = false, steps = {}, nvimVersion = tostring(vim.version().major) .. '.' .. vim.version().minor .. '.' .. vim.version().patch }
local plan

local function ms_since(t0) return math.floor((vim.loop.hrtime() - t0) / 1e5) / 10 end

local function finish(code)
  report.totalMs = ms_since(started)
  local json = vim.json.encode(report)
  if plan and plan.resultFile then
    local f = io.open(plan.resultFile, 'w')
    if f then f:write(json); f:close() end
  end
  io.stdout:write('DEWMARK_PROBE_REPORT ', json, '\n')
  io.stdout:flush()
  vim.cmd('cquit ' .. code) -- :cquit N exits with code N (0 = success)
end

-- Last publishDiagnostics per uri, in the server's own (UTF-16) form, with a running count.
local published = {}   -- uri -> { seq = n, params = {...} }
local publish_seq = 0
do
  local orig = vim.lsp.handlers['textDocument/publishDiagnostics']
  vim.lsp.handlers['textDocument/publishDiagnostics'] = function(err, result, ctx, config)
    publish_seq = publish_seq + 1
    if result and result.uri then published[result.uri] = { seq = publish_seq, params = result } end
    return orig(err, result, ctx, config)
  end
end

-- Replaces the string "$URI" anywhere in a value with the current document's uri.
local function subst_uri(v, uri)
  if v == '$URI' then return uri end
  if type(v) == 'table' and v ~= vim.NIL then
    local out = {}
    for k, x in pairs(v) do out[k] = subst_uri(x, uri) end
    if getmetatable(v) then setmetatable(out, getmetatable(v)) end
    return out
  end
  return v
end

local function buf_clients(bufnr)
  local list = {}
  if vim.lsp.get_clients then
    list = vim.lsp.get_clients({ bufnr = bufnr })
  else
    for _, c in pairs(vim.lsp.buf_get_clients(bufnr)) do table.insert(list, c) end
  end
  return list
end

local function main()
  local plan_path = assert(os.getenv('DEWMARK_PROBE_PLAN'), 'DEWMARK_PROBE_PLAN is not set (the path of the plan JSON)')
  local fh = assert(io.open(plan_path, 'r'), 'cannot read the plan file ' .. plan_path)
  plan = vim.json.decode(fh:read('*a'))
  fh:close()
  local T = plan.timeoutMs or 10000
  report.lspLogPath = vim.lsp.get_log_path()
  vim.lsp.set_log_level(plan.logLevel or 'warn')

  local client_id, client
  local exited = nil
  local init_t0 = vim.loop.hrtime()

  -- Chains the probe's own hooks onto a client config: the initialize result's serverInfo (0.7
  -- keeps none of it) and the server's exit (so a crash fails at once instead of at the timeout).
  local function with_hooks(config)
    local user_on_init, user_on_exit = config.on_init, config.on_exit
    config.on_init = function(c, result)
      if result and result.serverInfo then report.serverInfo = result.serverInfo end
      if user_on_init then return user_on_init(c, result) end
    end
    config.on_exit = function(code, signal, id)
      exited = { code = code, signal = signal }
      if user_on_exit then return user_on_exit(code, signal, id) end
    end
    return config
  end

  if plan.configFile then
    -- The user's own configuration (e.g. the README's snippet) starts the client when a buffer gets
    -- its filetype; the probe then uses whichever client attaches to the first opened document.
    -- start_client is wrapped only to add the probe's hooks (with_hooks); the config is otherwise the user's.
    local orig_start = vim.lsp.start_client
    vim.lsp.start_client = function(config) return orig_start(with_hooks(config)) end
    -- A prelude (a stand-in for what a later Neovim or a plugin provides) runs first.
    if plan.preludeFile then vim.cmd('luafile ' .. vim.fn.fnameescape(plan.preludeFile)) end
    vim.cmd('luafile ' .. vim.fn.fnameescape(plan.configFile))
  else
    client_id = vim.lsp.start_client(with_hooks({
      name = plan.clientName or 'dewmark-probe',
      cmd = plan.cmd,
      cmd_cwd = plan.cmdCwd,
      cmd_env = plan.cmdEnv,
      root_dir = plan.root,            -- rootUri and workspaceFolders; without it rootUri is null
      settings = plan.settings,        -- answered to workspace/configuration by Neovim's own handler
      init_options = plan.initializationOptions,
      flags = { debounce_text_changes = 0 }, -- send didChange at once (0.7's default waits 150 ms)
    }))
    assert(client_id, 'vim.lsp.start_client failed (is cmd a valid argv? ' .. vim.inspect(plan.cmd) .. ')')
  end

  local docs = {}     -- path -> { bufnr, uri }
  local current       -- the document steps act on

  local function ensure_client(bufnr)
    if client then return end
    assert(vim.wait(T, function()
      if exited then return true end
      if client_id then
        local c = vim.lsp.get_client_by_id(client_id)
        if c and c.initialized then client = c end
      else
        for _, c in ipairs(buf_clients(bufnr)) do
          if c.initialized then client = c; client_id = c.id; break end
        end
      end
      return client ~= nil
    end, 5), 'no initialized LSP client within ' .. T .. ' ms (server log: ' .. report.lspLogPath .. ')')
    assert(not exited, 'the server exited during initialize: ' .. vim.inspect(exited) .. '; its stderr is in ' .. report.lspLogPath)
    report.initMs = ms_since(init_t0)
    report.clientName = client.name
    report.serverCapabilities = client.server_capabilities or client.resolved_capabilities
    report.serverInfo = report.serverInfo or client.server_info
    report.offsetEncoding = client.offset_encoding
  end

  local function request(method, params, bufnr, allow_error)
    assert(client and not client.is_stopped(), method .. ': the client is not running')
    local done, rerr, rres = false, nil, nil
    local sent, req_id = client.request(method, params, function(err, result)
      rerr, rres, done = err, result, true
    end, bufnr)
    assert(sent, method .. ': request not sent (the client has stopped?)')
    if not vim.wait(T, function() return done end, 2) then
      pcall(client.cancel_request, req_id)
      error(method .. ': no answer within ' .. T .. ' ms')
    end
    if rerr and not allow_error then error(method .. ': server answered with an error: ' .. vim.inspect(rerr)) end
    return rres, rerr
  end

  local function pick_doc(step)
    if step.path then
      return assert(docs[step.path], 'step ' .. step.op .. ': document ' .. step.path .. ' was not opened')
    end
    return assert(current, 'step ' .. step.op .. ': open a document first')
  end

  local function doc_version(doc) return vim.lsp.util.buf_versions[doc.bufnr] or 0 end

  -- Waits for diagnostics of the document's current version (or, for a server that sends no
  -- version, for the first publish after the last open/edit).
  local function wait_diagnostics(doc, timeout, min_count)
    local want = doc_version(doc)
    local ok = vim.wait(timeout or T, function()
      local p = published[doc.uri]
      if not p then return false end
      local fresh
      if p.params.version ~= nil and p.params.version ~= vim.NIL then fresh = p.params.version >= want
      else fresh = p.seq > (doc.seq_at_change or 0) end
      return fresh and #(p.params.diagnostics or {}) >= (min_count or 0)
    end, 2)
    if not ok then
      local p = published[doc.uri]
      error(string.format('no diagnostics for version %d of %s within %d ms (last publish: %s)', want, doc.uri,
        timeout or T, p and vim.inspect({ version = p.params.version, count = #(p.params.diagnostics or {}) }) or 'none'))
    end
    local p = published[doc.uri]
    local vim_form = {}
    for _, d in ipairs(vim.diagnostic.get(doc.bufnr)) do
      table.insert(vim_form, { lnum = d.lnum, col = d.col, end_lnum = d.end_lnum, end_col = d.end_col,
        severity = d.severity, message = d.message, source = d.source, code = d.code })
    end
    return { uri = doc.uri, bufVersion = want, version = p.params.version, diagnostics = p.params.diagnostics or {},
      vimDiagnostics = vim_form }
  end

  -- The buffer as it would be written: lines joined by LF, plus the final LF when 'eol' is set.
  local function buffer_text(doc)
    local text = table.concat(vim.api.nvim_buf_get_lines(doc.bufnr, 0, -1, false), '\n')
    if vim.bo[doc.bufnr].eol and not vim.bo[doc.bufnr].binary then text = text .. '\n' end
    return text
  end

  local ops = {}

  function ops.open(step)
    vim.cmd('edit ' .. vim.fn.fnameescape(step.path))
    local bufnr = vim.api.nvim_get_current_buf()
    local doc = { bufnr = bufnr, uri = vim.uri_from_bufnr(bufnr), seq_at_change = publish_seq }
    docs[step.path] = doc
    current = doc
    -- Set explicitly: filetype detection is off under -u NONE, and languageId comes from filetype.
    -- (only when it differs: setting it again fires FileType again, and a config may start a client per event)
    local ft = step.filetype or 'markdown'
    if vim.bo[bufnr].filetype ~= ft then vim.bo[bufnr].filetype = ft end
    if client_id and not plan.configFile then
      assert(vim.lsp.buf_attach_client(bufnr, client_id), 'buf_attach_client failed')
    end
    ensure_client(bufnr)
    if plan.configFile then
      assert(vim.wait(T, function() return vim.lsp.buf_is_attached(bufnr, client_id) end, 2),
        'the configured client did not attach to ' .. step.path)
    end
    return { uri = doc.uri, bufnr = bufnr, filetype = vim.bo[bufnr].filetype, version = doc_version(doc) }
  end

  function ops.waitDiagnostics(step)
    return wait_diagnostics(pick_doc(step), step.timeoutMs, step.minCount)
  end

  local function position_params(doc, step)
    if step.cursor then -- 0-based line, BYTE column: exercises the client's byte -> UTF-16 conversion
      vim.api.nvim_win_set_buf(0, doc.bufnr)
      vim.api.nvim_win_set_cursor(0, { step.cursor.line + 1, step.cursor.byteCol })
      local p = vim.lsp.util.make_position_params(0, client.offset_encoding)
      return p.position
    end
    return assert(step.position, 'step ' .. step.op .. ': give position {line, character} or cursor {line, byteCol}')
  end

  function ops.hover(step)
    local doc = pick_doc(step)
    local pos = position_params(doc, step)
    local r = request('textDocument/hover', { textDocument = { uri = doc.uri }, position = pos }, doc.bufnr)
    return { position = pos, result = r }
  end

  function ops.documentSymbols(step)
    local doc = pick_doc(step)
    return { result = request('textDocument/documentSymbol', { textDocument = { uri = doc.uri } }, doc.bufnr) }
  end

  function ops.completion(step)
    local doc = pick_doc(step)
    local pos = position_params(doc, step)
    local r = request('textDocument/completion', { textDocument = { uri = doc.uri }, position = pos,
      context = { triggerKind = 1 } }, doc.bufnr)
    return { position = pos, result = r }
  end

  function ops.edit(step)
    -- nvim_buf_set_lines semantics: 0-based start, end exclusive, -1 = end of buffer.
    local doc = pick_doc(step)
    doc.seq_at_change = publish_seq
    vim.api.nvim_buf_set_lines(doc.bufnr, step.startLine, step.endLine, false, step.lines)
    local out = { version = doc_version(doc), text = buffer_text(doc) }
    if step.waitDiagnostics ~= false then
      out.diagnostics = wait_diagnostics(doc, step.timeoutMs, step.minCount)
    end
    return out
  end

  function ops.inlayHints(step)
    -- Neovim 0.7 neither announces nor requests inlay hints; send the request raw.
    local doc = pick_doc(step)
    local range = step.range or { start = { line = 0, character = 0 },
      ['end'] = { line = vim.api.nvim_buf_line_count(doc.bufnr), character = 0 } }
    return { range = range, result = request('textDocument/inlayHint', { textDocument = { uri = doc.uri }, range = range }, doc.bufnr) }
  end

  function ops.codeAction(step)
    local doc = pick_doc(step)
    local p = published[doc.uri]
    local diags = {}
    for _, d in ipairs(p and p.params.diagnostics or {}) do
      local s, e = d.range.start, d.range['end']
      local r = step.range
      if s.line <= r['end'].line and e.line >= r.start.line then table.insert(diags, d) end
    end
    local ctx = { diagnostics = diags }
    if step.only then ctx.only = step.only end
    local actions = request('textDocument/codeAction', { textDocument = { uri = doc.uri }, range = step.range, context = ctx }, doc.bufnr) or {}
    local out = { result = actions }
    if step.apply then
      local chosen
      for _, a in ipairs(actions) do
        if a.title and string.find(a.title, step.apply, 1, true) then chosen = a; break end
      end
      assert(chosen, 'no code action whose title contains "' .. step.apply .. '"; got: ' ..
        vim.inspect(vim.tbl_map(function(a) return a.title end, actions)))
      if not chosen.edit and not chosen.command and client.server_capabilities.codeActionProvider
          and type(client.server_capabilities.codeActionProvider) == 'table'
          and client.server_capabilities.codeActionProvider.resolveProvider then
        chosen = request('codeAction/resolve', chosen, doc.bufnr)
      end
      doc.seq_at_change = publish_seq
      local before = doc_version(doc)
      -- (a copy: applying annotates the edit's tables, and the report shows the actions as received)
      if chosen.edit then vim.lsp.util.apply_workspace_edit(vim.deepcopy(chosen.edit), client.offset_encoding) end
      local cmd = chosen.command
      if type(cmd) == 'table' then
        request('workspace/executeCommand', { command = cmd.command, arguments = cmd.arguments }, doc.bufnr)
      elseif type(cmd) == 'string' then
        request('workspace/executeCommand', { command = cmd, arguments = chosen.arguments }, doc.bufnr)
      end
      out.applied = chosen.title
      out.text = buffer_text(doc)
      if step.waitDiagnostics ~= false and doc_version(doc) > before then
        out.diagnostics = wait_diagnostics(doc, step.timeoutMs, step.minCount)
      end
    end
    return out
  end

  function ops.request(step)
    local doc = current
    local params = doc and subst_uri(step.params, doc.uri) or step.params
    local r, err = request(step.method, params, doc and doc.bufnr or 0, step.allowError)
    return { method = step.method, result = r, error = err }
  end

  function ops.text(step)
    return { text = buffer_text(pick_doc(step)) }
  end

  function ops.shutdown(_)
    assert(client, 'shutdown: no client')
    client.stop() -- shutdown request, then exit notification
    local stopped = vim.wait(T, function() return vim.lsp.client_is_stopped(client.id) end, 5)
    if not stopped then error('the server did not stop within ' .. T .. ' ms after shutdown/exit') end
    vim.wait(T, function() return exited ~= nil or plan.configFile ~= nil end, 5)
    report.serverExit = exited
    return { exit = exited }
  end

  -- Leaves the server stopped (shutdown + exit), also after a failed step or without a shutdown step.
  local function stop_client()
    if client and not vim.lsp.client_is_stopped(client.id) then
      client.stop()
      vim.wait(T, function() return vim.lsp.client_is_stopped(client.id) end, 5)
    end
    report.serverExit = report.serverExit or exited
  end

  for i, step in ipairs(plan.steps or {}) do
    local t0 = vim.loop.hrtime()
    local ok, res = xpcall(function()
      local fn = assert(ops[step.op], 'unknown op "' .. tostring(step.op) .. '"')
      return fn(step)
    end, debug.traceback)
    if not ok then
      report.failedStep = i
      report.error = 'step ' .. i .. ' (' .. tostring(step.op) .. '): ' .. tostring(res)
      stop_client()
      return false
    end
    res = res or {}
    res.op = step.op
    res.ms = ms_since(t0)
    table.insert(report.steps, res)
  end

  stop_client()
  return true
end

local ok, res = xpcall(main, debug.traceback)
if not ok then report.error = tostring(res) end
report.ok = ok and res == true
finish(report.ok and 0 or 1)
