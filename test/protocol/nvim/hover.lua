-- Asks Boltzmark's language server for a hover from Neovim's own LSP client,
-- headless, and writes what came back to BM_OUT. Written for Neovim 0.7+
-- (Debian bookworm): vim.lsp.start_client + buf_attach_client, run with
--   nvim --headless -u NONE -i NONE -n -c 'luafile hover.lua'
-- Environment: BM_SERVER (path of dist/server.js), BM_NOTE (markdown file),
-- BM_LINE / BM_CHAR (0-based position), BM_OUT (result file).
local function done(code, text)
  local f = io.open(os.getenv('BM_OUT'), 'w')
  f:write(text or '')
  f:close()
  for _, c in pairs(vim.lsp.get_active_clients()) do c.stop() end
  vim.wait(2000, function() return #vim.lsp.get_active_clients() == 0 end, 20)
  if code == 0 then vim.cmd('qall!') else vim.cmd('cquit ' .. code) end
end

local ok, err = pcall(function()
  vim.cmd('edit ' .. vim.fn.fnameescape(os.getenv('BM_NOTE')))
  local buf = vim.api.nvim_get_current_buf()
  vim.bo[buf].filetype = 'markdown'
  local gone = nil
  local id = vim.lsp.start_client({
    name = 'boltzmark',
    cmd = { 'node', os.getenv('BM_SERVER'), '--stdio' },
    root_dir = vim.fn.fnamemodify(os.getenv('BM_NOTE'), ':p:h'),
    on_exit = function(code) gone = code end,
  })
  if not id then return done(1, 'start_client failed') end
  vim.lsp.buf_attach_client(buf, id)
  local ready = vim.wait(15000, function()
    local c = vim.lsp.get_client_by_id(id)
    return gone ~= nil or (c ~= nil and c.initialized == true)
  end, 20)
  if gone ~= nil or not ready then return done(1, 'server did not initialize') end
  local params = {
    textDocument = vim.lsp.util.make_text_document_params(buf),
    position = { line = tonumber(os.getenv('BM_LINE')), character = tonumber(os.getenv('BM_CHAR')) },
  }
  local reply, why = vim.lsp.get_client_by_id(id).request_sync('textDocument/hover', params, 15000, buf)
  if not reply or reply.err or not reply.result then return done(2, 'no hover: ' .. vim.inspect(why or (reply and reply.err))) end
  local contents = reply.result.contents
  done(0, type(contents) == 'table' and (contents.value or vim.inspect(contents)) or tostring(contents))
end)
if not ok then done(3, 'error: ' .. tostring(err)) end
