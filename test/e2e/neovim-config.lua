-- Dewmark language server for Markdown notes in Neovim 0.7 or later (init.lua, or :luafile this file).
-- Needs `dewmark-language-server` on PATH (npm install -g, or set DEWMARK_LANGUAGE_SERVER to its path).
local dewmark = { client_id = nil }

vim.api.nvim_create_autocmd('FileType', {
  pattern = 'markdown',
  callback = function(args)
    if dewmark.client_id == nil or vim.lsp.client_is_stopped(dewmark.client_id) then
      dewmark.client_id = vim.lsp.start_client({
        name = 'dewmark',
        cmd = { vim.env.DEWMARK_LANGUAGE_SERVER or 'dewmark-language-server', '--stdio' },
        root_dir = vim.fn.getcwd(),
        -- Optional; these are the defaults. pressure = '84 kPa' or elevation = '1600 m' for a site.
        settings = { dewmark = { units = 'SI', checkClaims = true, precision = 0 } },
        flags = { debounce_text_changes = 100 },
      })
    end
    if dewmark.client_id then vim.lsp.buf_attach_client(args.buf, dewmark.client_id) end
  end,
})
