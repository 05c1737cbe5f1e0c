-- Stand-ins, for the Neovim 0.7 the tests run, of what the README's other Neovim configurations
-- call, so that their very text can be run against the server (used by neovim-configs.test.ts):
--
--   * Neovim 0.11's `vim.lsp.config(name, cfg)` and `vim.lsp.enable(name)`;
--   * nvim-lspconfig's `lspconfig.configs` (a server of one's own: `configs.NAME = { default_config = … }`),
--     `lspconfig.util.root_pattern(...)` and `require('lspconfig').NAME.setup(opts)`.
--
-- Each does what its documentation says for the fields it knows, and refuses any other field (a
-- misspelt one fails the test instead of being ignored): on a buffer of one of `filetypes`, find the
-- root folder (`root_markers`: the nearest folder above the file holding one of them; `root_dir`: a
-- function of the file name, or a folder), and start one client per root with `cmd`, `settings` and
-- `init_options` (`vim.lsp.start_client`, which the probe wraps), attached to the buffer. Not Neovim
-- 0.11 or the plugin themselves: what they do beyond this is not tested here.

local function check_fields(cfg, known, what)
  for k in pairs(cfg) do
    assert(known[k], what .. ': unknown field "' .. tostring(k) .. '"')
  end
end

local function set_of(list)
  local s = {}
  for _, v in ipairs(list) do s[v] = true end
  return s
end

local function dirname(path) return vim.fn.fnamemodify(path, ':h') end

-- The nearest folder at or above `dir` that holds one of `markers` (files or folders), or nil.
local function find_root(dir, markers)
  local cur = dir
  while true do
    for _, m in ipairs(markers) do
      if vim.loop.fs_stat(cur .. '/' .. m) then return cur end
    end
    local up = dirname(cur)
    if up == cur then return nil end
    cur = up
  end
end

local clients = {} -- name .. root -> client id

local function start(cfg, bufnr, root)
  local key = cfg.name .. '\0' .. (root or '')
  local id = clients[key]
  if id == nil or vim.lsp.client_is_stopped(id) then
    assert(type(cfg.cmd) == 'table' and #cfg.cmd > 0, cfg.name .. ': cmd must be a list (the server and its arguments)')
    id = vim.lsp.start_client({
      name = cfg.name,
      cmd = cfg.cmd,
      root_dir = root,
      settings = cfg.settings,
      init_options = cfg.init_options,
      flags = { debounce_text_changes = 0 },
    })
    clients[key] = id
  end
  if id then vim.lsp.buf_attach_client(bufnr, id) end
end

local function on_filetypes(filetypes, callback)
  assert(type(filetypes) == 'table' and #filetypes > 0, 'filetypes must be a list such as { "markdown" }')
  vim.api.nvim_create_autocmd('FileType', {
    pattern = table.concat(filetypes, ','),
    callback = function(args) callback(args.buf, vim.api.nvim_buf_get_name(args.buf)) end,
  })
end

-- Neovim 0.11: vim.lsp.config / vim.lsp.enable ---------------------------------------------------
local CONFIG_FIELDS = set_of({ 'cmd', 'filetypes', 'root_markers', 'root_dir', 'settings', 'init_options',
  'capabilities', 'on_attach', 'on_init', 'name', 'workspace_required', 'reuse_client', 'handlers', 'flags' })
local configured = {}

vim.lsp.config = function(name, cfg)
  assert(type(name) == 'string' and type(cfg) == 'table', 'vim.lsp.config(name, { ... })')
  check_fields(cfg, CONFIG_FIELDS, 'vim.lsp.config ' .. name)
  configured[name] = vim.tbl_deep_extend('force', configured[name] or {}, cfg)
end

vim.lsp.enable = function(names)
  for _, name in ipairs(type(names) == 'table' and names or { names }) do
    local cfg = assert(configured[name], 'vim.lsp.enable: no vim.lsp.config for "' .. name .. '"')
    cfg.name = cfg.name or name
    on_filetypes(cfg.filetypes, function(bufnr, file)
      local root
      if type(cfg.root_dir) == 'string' then root = cfg.root_dir
      elseif cfg.root_markers then root = find_root(dirname(file), cfg.root_markers) end
      start(cfg, bufnr, root)
    end)
  end
end

-- nvim-lspconfig ---------------------------------------------------------------------------------
local DEFAULT_CONFIG_FIELDS = set_of({ 'cmd', 'filetypes', 'root_dir', 'single_file_support', 'settings',
  'init_options', 'capabilities', 'on_attach', 'on_new_config', 'name', 'handlers', 'flags' })

local util = {
  root_pattern = function(...)
    local markers = { ... }
    return function(file) return find_root(dirname(file), markers) end
  end,
}

local configs = setmetatable({}, {
  __newindex = function(t, name, spec)
    assert(type(spec) == 'table' and type(spec.default_config) == 'table', 'configs.' .. name .. ' = { default_config = { ... } }')
    check_fields(spec.default_config, DEFAULT_CONFIG_FIELDS, 'lspconfig default_config of ' .. name)
    rawset(t, name, {
      setup = function(opts)
        local cfg = vim.tbl_deep_extend('force', spec.default_config, opts or {})
        cfg.name = name
        on_filetypes(cfg.filetypes, function(bufnr, file)
          local root = type(cfg.root_dir) == 'function' and cfg.root_dir(file) or cfg.root_dir
          if root == nil and not cfg.single_file_support then return end
          start(cfg, bufnr, root)
        end)
      end,
      document_config = spec,
    })
  end,
})

package.preload['lspconfig.util'] = function() return util end
package.preload['lspconfig.configs'] = function() return configs end
package.preload['lspconfig'] = function()
  return setmetatable({ util = util }, {
    __index = function(_, name) return assert(rawget(configs, name), 'lspconfig: no server "' .. name .. '"') end,
  })
end
